//! The C door's part of the quantity catalogue, generated from the core's catalogue: the
//! `AerostrataQuantity` ids, the catalogue's texts as C strings, and the records whose
//! fields are catalogue quantities (`AerostrataState`, `AerostrataFlightPoint`,
//! `AerostrataSpecies`) with their accessors. The build script writes it
//! into OUT_DIR for `src/catalogue.rs` to include; `cargo xtask header` (which shares this
//! file through `#[path]`) writes it into the copy of the crate that cbindgen reads.

use std::fmt::Write as _;

use aerostrata_core::quantity::{Group, Info};
use aerostrata_core::units::Unit;
use aerostrata_core::{FlightPoint, Quantity};

/// The field of a record that holds `info`: its machine name and its SI unit, as the
/// core's own field names read (`speed_of_sound_m_s`).
pub fn field(info: &Info) -> String {
    match info.si.suffix() {
        "" => info.name.to_owned(),
        suffix => format!("{}_{}", info.name, suffix.to_ascii_lowercase()),
    }
}

/// The CSV column of `info` in `unit` (`temperature_degF`), as every door names it.
fn column(info: &Info, unit: &Unit) -> String {
    match unit.suffix() {
        "" => info.name.to_owned(),
        suffix => format!("{}_{suffix}", info.name),
    }
}

/// `label` with its first letter capitalised, for a sentence.
fn capitalised(label: &str) -> String {
    let mut chars = label.chars();
    chars.next().map_or_else(String::new, |first| first.to_uppercase().chain(chars).collect())
}

fn unit_words(info: &Info) -> String {
    match info.si.symbol() {
        "" => String::new(),
        symbol => format!(", {symbol}"),
    }
}

/// The field of a species' number density in a record of species: the species' symbol
/// and the unit (`n2_m3`), as the core's `Species` names it.
pub fn species_field(info: &Info) -> String {
    format!("{}_{}", info.symbol.to_ascii_lowercase(), info.si.suffix().to_ascii_lowercase())
}

/// A `#[repr(C)]` record whose fields are catalogue quantities, every one an `f64`.
struct Record<'a> {
    name: &'a str,
    /// Its doc comment, `///` lines.
    doc: &'a str,
    quantities: &'a [Quantity],
    /// The field that holds a quantity.
    field: fn(&Info) -> String,
    /// For a record whose values may be undefined (NaN, with a bit clear): the doc of its
    /// `defined` bit set. Such a record is read by quantity id as well (`get`). `None` for
    /// a record whose values are always defined.
    defined: Option<&'a str>,
}

impl Record<'_> {
    /// The struct and its accessors: `from_values` builds it from a quantity's value (with
    /// the bit set where values may be undefined; fallible where they may not), `get`
    /// reads a field by quantity.
    fn write(&self, out: &mut String) {
        let name = self.name;
        let _ = writeln!(
            out,
            "{}\n#[repr(C)]\n#[derive(Debug, Clone, Copy, PartialEq)]\npub struct {name} {{",
            self.doc
        );
        for q in self.quantities {
            let info = q.info();
            let nan =
                if info.may_be_undefined && self.defined.is_some() { " NaN where undefined." } else { "" };
            let _ = writeln!(
                out,
                "    /// {}{}: {}.{nan}\n    pub {}: f64,",
                capitalised(info.label),
                unit_words(&info),
                info.description,
                (self.field)(&info)
            );
        }
        if let Some(doc) = self.defined {
            let _ = writeln!(out, "    /// {doc}\n    pub defined: u32,");
        }
        let _ = writeln!(out, "}}\n\nimpl {name} {{");
        let fields = |value: &str| -> String {
            self.quantities
                .iter()
                .map(|q| format!("            {}: value(Quantity::{q:?}){value},\n", (self.field)(&q.info())))
                .collect()
        };
        match self.defined {
            Some(_) => {
                let _ = writeln!(
                    out,
                    "    /// The record of the values `value` gives for each quantity, with the bit set \
                     `defined`.\n    pub(crate) fn from_values(value: impl Fn(Quantity) -> f64, defined: u32) -> \
                     Self {{\n        Self {{\n{}            defined,\n        }}\n    }}\n",
                    fields("")
                );
                let _ = writeln!(
                    out,
                    "    /// The field that holds `quantity`, if the record has one.\n    pub(crate) fn \
                     get(&self, quantity: Quantity) -> Option<f64> {{\n        match quantity {{"
                );
                for q in self.quantities {
                    let _ = writeln!(
                        out,
                        "            Quantity::{q:?} => Some(self.{}),",
                        (self.field)(&q.info())
                    );
                }
                let _ = writeln!(out, "            _ => None,\n        }}\n    }}");
            }
            None => {
                let _ = writeln!(
                    out,
                    "    /// The record of the values `value` gives for each quantity, or its first \
                     error.\n    pub(crate) fn from_values<E>(value: impl Fn(Quantity) -> Result<f64, E>) -> \
                     Result<Self, E> {{\n        Ok(Self {{\n{}        }})\n    }}",
                    fields("?")
                );
            }
        }
        out.push_str("}\n\n");
    }
}

/// The generated source: items only (no inner attributes), since it is `include!`d.
pub fn generate() -> String {
    let mut out = String::from(
        "// Generated by bindings/c/build/catalogue.rs from the core's quantity catalogue\n\
         // (crates/aerostrata/src/quantity.rs).\n\n\
         use aerostrata_core::Quantity;\n\n\
         /// A quantity of the catalogue, by its stable id (never reused or renumbered).\n\
         /// Functions take the id as a `uint32_t`, so an unknown value is an error status rather\n\
         /// than undefined behaviour; `aerostrata_quantity_info` describes each one.\n\
         #[repr(u32)]\n\
         #[allow(non_camel_case_types)]\n\
         #[derive(Debug, Clone, Copy, PartialEq, Eq)]\n\
         pub enum AerostrataQuantity {\n",
    );
    for q in Quantity::ALL {
        let info = q.info();
        let _ = writeln!(
            out,
            "    /// {}{} ({}): {}.\n    {} = {},",
            capitalised(info.label),
            unit_words(&info),
            info.symbol,
            info.description,
            info.name.to_ascii_uppercase(),
            info.id
        );
    }
    let _ = writeln!(
        out,
        "}}\n\n/// How many quantities the catalogue has: the ids run from 0 to this minus 1.\n\
         pub const AEROSTRATA_QUANTITY_COUNT: u32 = {};\n",
        Quantity::ALL.len()
    );
    let _ = writeln!(
        out,
        "/// The catalogue's texts as C strings, in id order: name, symbol, label, description,\n\
         /// SI unit, US unit, CSV column in SI, CSV column in US units.\n\
         pub(crate) static TEXTS: [[&core::ffi::CStr; 8]; {}] = [",
        Quantity::ALL.len()
    );
    for q in Quantity::ALL {
        let i = q.info();
        let (si, us) = (column(&i, i.si), column(&i, i.us));
        let texts = [i.name, i.symbol, i.label, i.description, i.si.symbol(), i.us.symbol(), &si, &us];
        let literals: Vec<String> = texts.iter().map(|t| format!("c{t:?}")).collect();
        let _ = writeln!(out, "    [{}],", literals.join(", "));
    }
    out.push_str("];\n\n");
    let state: Vec<Quantity> = Quantity::of_group(Group::State).collect();
    let species: Vec<Quantity> = Quantity::of_group(Group::Species).collect();
    let records = [
        Record {
            name: "AerostrataState",
            doc: "/// The full state of the atmosphere at one altitude, SI units named in each field.\n///\n\
                  /// The continuum properties (speed of sound, viscosities, conductivity) are not defined\n\
                  /// in the free-molecular air above 86 km: there they are NaN and the bit\n\
                  /// `AEROSTRATA_DEFINED_CONTINUUM` of `defined` is clear. Every other field is always a\n\
                  /// finite number. `aerostrata_state_get` reads a field by its quantity id.",
            quantities: &state,
            field,
            defined: Some(
                "Bit set: `AEROSTRATA_DEFINED_CONTINUUM` when the continuum properties are defined.",
            ),
        },
        Record {
            name: "AerostrataFlightPoint",
            doc: "/// The values at one sample of a flight. A field that is not defined at the sample (no\n\
                  /// speed of sound above 86 km, no drag without a drag curve, no Reynolds number without\n\
                  /// a reference length) is NaN, with its bit clear in `defined`.\n\
                  /// `aerostrata_flight_point_get` reads a field by its quantity id.",
            quantities: &FlightPoint::QUANTITIES,
            field,
            defined: Some("`AEROSTRATA_POINT_*` bits of the fields that are set."),
        },
        Record {
            name: "AerostrataSpecies",
            doc: "/// The number densities of the six species of the 1976 standard's upper part, 1/m^3, in\n\
                  /// the standard's order.",
            quantities: &species,
            field: species_field,
            defined: None,
        },
    ];
    for record in &records {
        record.write(&mut out);
    }
    out.truncate(out.trim_end().len());
    out.push('\n');
    out
}
