//! Soundings through serde (the `serde` feature): a table serialises as what it was built
//! from (its kind of altitude, its rows as given, what it does beyond them), and with
//! `alloc` deserialises through the constructors' checks, row by row, so that a format
//! that knows lines (JSON) reports the line of a bad row.

use super::rows::SoundingLevel;
use super::table::Tabulated;

/// The rows of a table, serialised as given.
struct Rows<'a>(&'a [SoundingLevel]);

impl serde::Serialize for Rows<'_> {
    fn serialize<S: serde::Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        serializer.collect_seq(self.0.iter().map(SoundingLevel::row))
    }
}

/// A table serialises as what it was built from: `altitude` (its kind), `rows` as
/// given, and what it does `below` and `above` them.
impl<S: AsRef<[SoundingLevel]>> serde::Serialize for Tabulated<S> {
    fn serialize<Ser: serde::Serializer>(&self, serializer: Ser) -> Result<Ser::Ok, Ser::Error> {
        use serde::ser::SerializeStruct;
        let mut out = serializer.serialize_struct("Tabulated", 4)?;
        out.serialize_field("altitude", &self.kind())?;
        out.serialize_field("rows", &Rows(self.levels()))?;
        out.serialize_field("below", &self.below())?;
        out.serialize_field("above", &self.above())?;
        out.end()
    }
}

#[cfg(feature = "alloc")]
mod owned {
    use alloc::vec::Vec;
    use core::fmt;

    use serde::de::{DeserializeSeed, Error as _, MapAccess, SeqAccess, Visitor};

    use crate::altitude::AltitudeKind;
    use crate::units::Quoted;

    use super::super::interpolate::OutsideTable;
    use super::super::rows::{check_row, SoundingLevel, SoundingRow};
    use super::super::table::Tabulated;

    /// Rows checked one by one as they are read, each inside its own map visit, so
    /// that a format that knows lines (JSON) reports the line of the bad row.
    struct CheckedRows(Vec<SoundingRow>);

    impl<'de> serde::Deserialize<'de> for CheckedRows {
        fn deserialize<D: serde::Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
            struct RowsVisitor;
            impl<'de> Visitor<'de> for RowsVisitor {
                type Value = CheckedRows;
                fn expecting(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
                    f.write_str("a list of sounding rows")
                }
                fn visit_str<E: serde::de::Error>(self, text: &str) -> Result<Self::Value, E> {
                    Err(a_string(text, "a list of sounding rows"))
                }
                fn visit_seq<A: SeqAccess<'de>>(self, mut seq: A) -> Result<CheckedRows, A::Error> {
                    let mut rows = Vec::with_capacity(seq.size_hint().unwrap_or(0).min(4096));
                    while let Some(row) = seq.next_element_seed(RowSeed { before: &rows })? {
                        rows.push(row);
                    }
                    // Here, not in the table's constructor, so that the error carries the
                    // line of the list's end.
                    if rows.len() < 2 {
                        return Err(A::Error::custom(crate::Error::TooFewRows { count: rows.len() }));
                    }
                    Ok(CheckedRows(rows))
                }
            }
            deserializer.deserialize_any(RowsVisitor)
        }
    }

    /// The names of a row's fields, as [`SoundingRow`] serialises them.
    const FIELDS: [&str; 6] = [
        "altitude_m",
        "temperature_k",
        "pressure_pa",
        "density_kg_m3",
        "dew_point_k",
        "relative_humidity_percent",
    ];

    /// A string where something else belongs, refused with the string escaped and cut
    /// (serde's own message would quote it whole and raw).
    fn a_string<E: serde::de::Error>(text: &str, expected: &str) -> E {
        E::custom(format_args!("a string {} where {expected} belongs", Quoted(text)))
    }

    /// A name read as text and matched against `names` (a field, or a unit variant such as
    /// the kind of altitude): an unknown one is refused with its text escaped and cut
    /// (serde's own message would quote it whole and raw, control characters included).
    struct Named<'a> {
        names: &'a [&'static str],
        what: &'static str,
    }

    impl<'de> DeserializeSeed<'de> for Named<'_> {
        type Value = usize;
        fn deserialize<D: serde::Deserializer<'de>>(self, deserializer: D) -> Result<usize, D::Error> {
            deserializer.deserialize_identifier(self)
        }
    }

    impl<'de> Visitor<'de> for Named<'_> {
        type Value = usize;
        fn expecting(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            write!(f, "a {}", self.what)
        }
        fn visit_str<E: serde::de::Error>(self, text: &str) -> Result<usize, E> {
            self.names.iter().position(|name| *name == text).ok_or_else(|| {
                E::custom(format_args!(
                    "unknown {} {}, expected one of {}",
                    self.what,
                    Quoted(text),
                    self.names.join(", ")
                ))
            })
        }
        fn visit_bytes<E: serde::de::Error>(self, bytes: &[u8]) -> Result<usize, E> {
            self.visit_str(&alloc::string::String::from_utf8_lossy(bytes))
        }
    }

    /// A number; a string where it belongs is refused with the string escaped and cut.
    struct Number;

    impl<'de> DeserializeSeed<'de> for Number {
        type Value = Option<f64>;
        fn deserialize<D: serde::Deserializer<'de>>(self, deserializer: D) -> Result<Option<f64>, D::Error> {
            deserializer.deserialize_option(self)
        }
    }

    impl<'de> Visitor<'de> for Number {
        type Value = Option<f64>;
        fn expecting(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            f.write_str("a number or null")
        }
        fn visit_none<E: serde::de::Error>(self) -> Result<Option<f64>, E> {
            Ok(None)
        }
        fn visit_unit<E: serde::de::Error>(self) -> Result<Option<f64>, E> {
            Ok(None)
        }
        fn visit_some<D: serde::Deserializer<'de>>(self, deserializer: D) -> Result<Option<f64>, D::Error> {
            // `any`, not `f64`: a format asked for a number refuses a string itself, quoting
            // it raw; asked for anything it hands the string here. Numbers arrive as the
            // f64, i64 or u64 the format parsed, as `f64`'s own deserialisation takes them.
            deserializer.deserialize_any(self)
        }
        fn visit_f64<E: serde::de::Error>(self, value: f64) -> Result<Option<f64>, E> {
            Ok(Some(value))
        }
        fn visit_i64<E: serde::de::Error>(self, value: i64) -> Result<Option<f64>, E> {
            Ok(Some(value as f64))
        }
        fn visit_u64<E: serde::de::Error>(self, value: u64) -> Result<Option<f64>, E> {
            Ok(Some(value as f64))
        }
        fn visit_str<E: serde::de::Error>(self, text: &str) -> Result<Option<f64>, E> {
            Err(E::custom(format_args!("a string {} where a number belongs", Quoted(text))))
        }
    }

    /// One row, read and checked against the rows `before` it.
    struct RowSeed<'a> {
        before: &'a [SoundingRow],
    }

    impl<'de> DeserializeSeed<'de> for RowSeed<'_> {
        type Value = SoundingRow;
        fn deserialize<D: serde::Deserializer<'de>>(self, deserializer: D) -> Result<SoundingRow, D::Error> {
            deserializer.deserialize_any(self)
        }
    }

    impl<'de> Visitor<'de> for RowSeed<'_> {
        type Value = SoundingRow;
        fn expecting(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            f.write_str("a sounding row")
        }
        fn visit_str<E: serde::de::Error>(self, text: &str) -> Result<Self::Value, E> {
            Err(a_string(text, "a sounding row"))
        }
        fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> Result<SoundingRow, A::Error> {
            let mut values: [Option<f64>; 6] = [None; 6];
            let mut seen = [false; 6];
            while let Some(slot) = map.next_key_seed(Named { names: &FIELDS, what: "field" })? {
                if core::mem::replace(&mut seen[slot], true) {
                    return Err(A::Error::duplicate_field(FIELDS[slot]));
                }
                // `null` reads as "not given", as an absent field does.
                values[slot] = map.next_value_seed(Number)?;
            }
            let [altitude, temperature, pressure, density, dew_point, relative_humidity] = values;
            let row = SoundingRow {
                altitude_m: altitude.ok_or_else(|| A::Error::missing_field(FIELDS[0]))?,
                temperature_k: temperature.ok_or_else(|| A::Error::missing_field(FIELDS[1]))?,
                pressure_pa: pressure,
                density_kg_m3: density,
                dew_point_k: dew_point,
                relative_humidity_percent: relative_humidity,
            };
            check_row(self.before.len(), &row, self.before).map_err(A::Error::custom)?;
            Ok(row)
        }
    }

    /// What a table does beyond a side, as [`OutsideTable`] serialises it (`"error"` or
    /// `{"blend_into_us1976": {"depth_m": D}}`), read with what a person typed escaped
    /// and cut in every refusal.
    struct Side;

    const SIDES: [&str; 2] = ["error", "blend_into_us1976"];

    impl<'de> DeserializeSeed<'de> for Side {
        type Value = OutsideTable;
        fn deserialize<D: serde::Deserializer<'de>>(self, deserializer: D) -> Result<OutsideTable, D::Error> {
            deserializer.deserialize_any(self)
        }
    }

    impl<'de> Visitor<'de> for Side {
        type Value = OutsideTable;
        fn expecting(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            f.write_str("\"error\" or {\"blend_into_us1976\": {\"depth_m\": D}}")
        }
        fn visit_str<E: serde::de::Error>(self, text: &str) -> Result<OutsideTable, E> {
            let named = Named { names: &SIDES[..1], what: "side" };
            named.visit_str(text).map(|_| OutsideTable::Error)
        }
        fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> Result<OutsideTable, A::Error> {
            let Some(_) = map.next_key_seed(Named { names: &SIDES[1..], what: "side" })? else {
                return Err(A::Error::custom(
                    "an empty side; write \"error\" or {\"blend_into_us1976\": {...}}",
                ));
            };
            let depth_m = map.next_value_seed(Depth)?;
            if map.next_key_seed(Named { names: &[], what: "field" })?.is_some() {
                return Err(A::Error::custom("a side has one entry"));
            }
            Ok(OutsideTable::BlendIntoUs1976 { depth_m })
        }
    }

    /// `{"depth_m": D}`.
    struct Depth;

    impl<'de> DeserializeSeed<'de> for Depth {
        type Value = f64;
        fn deserialize<D: serde::Deserializer<'de>>(self, deserializer: D) -> Result<f64, D::Error> {
            deserializer.deserialize_any(self)
        }
    }

    impl<'de> Visitor<'de> for Depth {
        type Value = f64;
        fn expecting(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            f.write_str("{\"depth_m\": D}")
        }
        fn visit_str<E: serde::de::Error>(self, text: &str) -> Result<Self::Value, E> {
            Err(a_string(text, "{\"depth_m\": D}"))
        }
        fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> Result<f64, A::Error> {
            let mut depth = None;
            while map.next_key_seed(Named { names: &["depth_m"], what: "field" })?.is_some() {
                if depth.is_some() {
                    return Err(A::Error::duplicate_field("depth_m"));
                }
                depth =
                    Some(map.next_value_seed(Number)?.ok_or_else(|| A::Error::custom("depth_m is null"))?);
            }
            depth.ok_or_else(|| A::Error::missing_field("depth_m"))
        }
    }

    /// The fields of a table.
    #[derive(Clone, Copy)]
    enum Part {
        Altitude,
        Rows,
        Below,
        Above,
    }

    const PARTS: [&str; 4] = ["altitude", "rows", "below", "above"];
    const KINDS: [&str; 2] = ["geometric", "geopotential"];

    /// A table built as soon as its kind and rows are read, and each side set as soon
    /// as it is read and the table is there, so that an error across rows or in a side
    /// carries the line where it was read.
    struct TableVisitor;

    impl<'de> Visitor<'de> for TableVisitor {
        type Value = Tabulated<Vec<SoundingLevel>>;
        fn expecting(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
            f.write_str("a sounding: altitude, rows, and optionally below and above")
        }
        fn visit_str<E: serde::de::Error>(self, text: &str) -> Result<Self::Value, E> {
            Err(a_string(text, "a sounding"))
        }
        fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> Result<Self::Value, A::Error> {
            let mut kind: Option<AltitudeKind> = None;
            let mut rows: Option<Vec<SoundingRow>> = None;
            let mut sides: [Option<OutsideTable>; 2] = [None, None];
            let mut table: Option<Tabulated<Vec<SoundingLevel>>> = None;
            let mut seen = [false; 4];
            while let Some(slot) = map.next_key_seed(Named { names: &PARTS, what: "field" })? {
                let part = [Part::Altitude, Part::Rows, Part::Below, Part::Above][slot];
                if core::mem::replace(&mut seen[slot], true) {
                    return Err(A::Error::duplicate_field(PARTS[slot]));
                }
                match part {
                    Part::Altitude => {
                        let index = map.next_value_seed(Named { names: &KINDS, what: "kind of altitude" })?;
                        kind = Some([AltitudeKind::Geometric, AltitudeKind::Geopotential][index]);
                    }
                    Part::Rows => rows = Some(map.next_value::<CheckedRows>()?.0),
                    Part::Below => sides[0] = Some(map.next_value_seed(Side)?),
                    Part::Above => sides[1] = Some(map.next_value_seed(Side)?),
                }
                if let (None, Some(kind), Some(rows)) = (&table, kind, &rows) {
                    table = Some(Tabulated::from_rows_vec(kind, rows).map_err(A::Error::custom)?);
                }
                if let Some(built) = table.take() {
                    table = Some(with_sides(built, &mut sides).map_err(A::Error::custom)?);
                }
            }
            let kind = kind.ok_or_else(|| A::Error::missing_field(PARTS[0]))?;
            let rows = rows.ok_or_else(|| A::Error::missing_field(PARTS[1]))?;
            let built = match table {
                Some(table) => table,
                None => Tabulated::from_rows_vec(kind, &rows).map_err(A::Error::custom)?,
            };
            with_sides(built, &mut sides).map_err(A::Error::custom)
        }
    }

    /// `table` with the sides read so far (each taken once).
    fn with_sides(
        table: Tabulated<Vec<SoundingLevel>>,
        sides: &mut [Option<OutsideTable>; 2],
    ) -> crate::Result<Tabulated<Vec<SoundingLevel>>> {
        let table = match sides[0].take() {
            Some(below) => table.with_below(below)?,
            None => table,
        };
        match sides[1].take() {
            Some(above) => table.with_above(above),
            None => Ok(table),
        }
    }

    /// Reads what [`Tabulated`]'s `Serialize` writes (from a self-describing format such as
    /// JSON: every part is read with `deserialize_any`, so that a string where it does not
    /// belong reaches the visitor and is echoed escaped), through the constructors'
    /// checks.
    impl<'de> serde::Deserialize<'de> for Tabulated<Vec<SoundingLevel>> {
        fn deserialize<D: serde::Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
            deserializer.deserialize_any(TableVisitor)
        }
    }
}
