//! The command line against the core's catalogue: `aerostrata quantities` lists every
//! quantity of `Quantity::ALL` with the catalogue's names, units and columns in every
//! format, and every column the data commands write (`eval` in both unit systems above
//! all) is the catalogue's column of a quantity.

mod common;

use aerostrata::airspeed::Airspeeds;
use aerostrata::flight::FlightPoint;
use aerostrata::quantity::Group;
use aerostrata::units::Unit;
use aerostrata::Quantity;
use common::*;

/// The JSON keys the cross-door test compares, in order.
const KEYS: [&str; 11] = [
    "id",
    "name",
    "symbol",
    "label",
    "description",
    "si_unit",
    "us_unit",
    "si_column",
    "us_column",
    "group",
    "may_be_undefined",
];

/// The CSV column of `quantity` in `unit`, spelled here from the catalogue's parts.
fn expected_column(quantity: Quantity, unit: &Unit) -> String {
    match unit.suffix() {
        "" => quantity.name().to_owned(),
        suffix => format!("{}_{suffix}", quantity.name()),
    }
}

/// The catalogue's columns of `quantities` in `us` or SI units.
fn columns_of(quantities: impl Iterator<Item = Quantity>, us: bool) -> Vec<String> {
    quantities.map(|q| expected_column(q, if us { q.us() } else { q.si() })).collect()
}

/// The header of CSV text.
fn header(csv: &str) -> Vec<String> {
    csv.lines().next().unwrap().split(',').map(str::to_owned).collect()
}

/// The records of CSV text, quoted fields as RFC 4180 has them (no line breaks inside).
fn records(csv: &str) -> Vec<Vec<String>> {
    csv.lines()
        .map(|line| {
            let (mut fields, mut field, mut quoted) = (Vec::new(), String::new(), false);
            let mut chars = line.chars().peekable();
            while let Some(c) = chars.next() {
                match (c, quoted) {
                    ('"', true) if chars.peek() == Some(&'"') => {
                        field.push('"');
                        chars.next();
                    }
                    ('"', _) => quoted = !quoted,
                    (',', false) => fields.push(std::mem::take(&mut field)),
                    _ => field.push(c),
                }
            }
            fields.push(field);
            fields
        })
        .collect()
}

#[test]
fn the_json_listing_is_the_catalogue() {
    let json: serde_json::Value =
        serde_json::from_str(&stdout_of(&["quantities", "--format", "json"], "")).unwrap();
    let listed = json.as_array().unwrap();
    assert_eq!(listed.len(), Quantity::ALL.len());
    for (entry, quantity) in listed.iter().zip(Quantity::ALL) {
        let info = quantity.info();
        let keys: Vec<&String> = entry.as_object().unwrap().keys().collect();
        assert_eq!(keys, KEYS, "{}", info.name);
        assert_eq!(entry["id"], info.id, "{}", info.name);
        assert_eq!(entry["name"], info.name);
        assert_eq!(entry["symbol"], info.symbol, "{}", info.name);
        assert_eq!(entry["label"], info.label, "{}", info.name);
        assert_eq!(entry["description"], info.description, "{}", info.name);
        assert_eq!(entry["si_unit"], info.si.symbol(), "{}", info.name);
        assert_eq!(entry["us_unit"], info.us.symbol(), "{}", info.name);
        assert_eq!(entry["si_column"], expected_column(*quantity, info.si), "{}", info.name);
        assert_eq!(entry["us_column"], expected_column(*quantity, info.us), "{}", info.name);
        assert_eq!(entry["may_be_undefined"], info.may_be_undefined, "{}", info.name);
        let group = entry["group"].as_str().unwrap();
        assert!(group.eq_ignore_ascii_case(&format!("{:?}", info.group)), "{}: {group}", info.name);
        // Each column names its quantity and unit to the core's own column reader.
        for (key, unit) in [("si_column", info.si), ("us_column", info.us)] {
            let read = Quantity::from_column(entry[key].as_str().unwrap()).unwrap();
            assert_eq!(read.quantity, *quantity, "{key} of {}", info.name);
            assert_eq!(read.unit.map_or("", Unit::symbol), unit.symbol(), "{key} of {}", info.name);
        }
    }
}

#[test]
fn every_format_lists_every_quantity() {
    let csv = records(&stdout_of(&["quantities", "--format", "csv"], ""));
    assert_eq!(csv[0], KEYS);
    assert_eq!(csv.len(), Quantity::ALL.len() + 1);
    for (record, quantity) in csv[1..].iter().zip(Quantity::ALL) {
        let info = quantity.info();
        assert_eq!(record.len(), KEYS.len(), "{}", info.name);
        // The descriptions hold commas and semicolons: quoted, they come back whole.
        assert_eq!((record[1].as_str(), record[4].as_str()), (info.name, info.description));
    }
    // The tables: a heading (no unit line: nothing here has a unit) and a row each.
    let table = stdout_of(&["quantities"], "");
    assert_eq!(table.lines().count(), Quantity::ALL.len() + 1);
    for (line, quantity) in table.lines().skip(1).zip(Quantity::ALL) {
        let mut words = line.split_whitespace();
        assert_eq!(words.next(), Some(quantity.id().to_string().as_str()));
        assert_eq!(words.next(), Some(quantity.name()));
    }
    let markdown = stdout_of(&["quantities", "--format", "markdown"], "");
    assert_eq!(markdown.lines().count(), Quantity::ALL.len() + 2);
    assert!(!markdown.contains(Quantity::SpeedOfSound.info().description), "tables leave descriptions out");
    // -o as everywhere.
    let dir = scratch("quantities");
    let file = dir.join("quantities.json");
    let (stdout, _) = run(&["quantities", "--format", "json", "-o", file.to_str().unwrap()], "");
    assert!(stdout.is_empty());
    assert_eq!(std::fs::read_to_string(&file).unwrap(), stdout_of(&["quantities", "--format", "json"], ""));
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn eval_writes_the_catalogues_state_columns() {
    let state = || Quantity::of_group(Group::State);
    let species = || Quantity::of_group(Group::Species);
    for us in [false, true] {
        let units = if us { "us" } else { "si" };
        let plain = stdout_of(&["eval", "--units", units], "0\n");
        assert_eq!(header(&plain), columns_of(state(), us), "--units {units}");
        let with_species = stdout_of(&["eval", "--species", "--units", units], "0\n400000\n");
        assert_eq!(header(&with_species), columns_of(state().chain(species()), us), "--units {units}");
        let table = stdout_of(&["table", "--format", "csv", "--units", units, "--to", "1000m"], "");
        assert_eq!(header(&table), columns_of(state(), us), "--units {units}");
    }
}

#[test]
fn every_data_command_writes_catalogue_columns() {
    let flight = "time_s,altitude_m,velocity_m_s\n0,0,0\n1,10,20\n";
    for us in [false, true] {
        let units = if us { "us" } else { "si" };
        let rows = stdout_of(&["flight", "-", "--summary", "none", "--units", units], flight);
        // A scalar-speed file carries no wind or attitude: the columns are the
        // catalogue's flight values up to the drag.
        let scalar = FlightPoint::QUANTITIES.into_iter().take_while(|q| *q != Quantity::VelocityEast);
        assert_eq!(header(&rows), columns_of(scalar, us), "--units {units}");
        let air = [Quantity::StaticPressure, Quantity::Density, Quantity::SpeedOfSound];
        let airspeed = stdout_of(
            &["airspeed", "--mach", "0.5", "--altitude", "0", "--units", units, "--format", "csv"],
            "",
        );
        let expected = columns_of(Airspeeds::QUANTITIES.into_iter().chain(air), us);
        assert_eq!(header(&airspeed), expected, "--units {units}");
        let pressure = if us { "29.92inHg" } else { "101325" };
        let altitude = stdout_of(
            &["altitude", "--pressure", pressure, "--qnh", pressure, "--units", units, "--format", "csv"],
            "",
        );
        let quantities = [
            Quantity::StaticPressure,
            Quantity::PressureAltitude,
            Quantity::PressureAltitudeGeometric,
            Quantity::QnhAltitude,
        ];
        assert_eq!(header(&altitude), columns_of(quantities.into_iter(), us), "--units {units}");
    }
    // --unit picks the airspeeds' unit among the core's.
    let mph =
        stdout_of(&["airspeed", "--tas", "100", "--unit", "mph", "--altitude", "0", "--format", "csv"], "");
    assert!(header(&mph)[..3].iter().all(|c| c.ends_with("_mph")), "{mph}");
}
