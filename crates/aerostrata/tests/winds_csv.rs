//! Winds read from text: a sounding's wind columns and a wind file of its own, in every
//! spelling and unit, and every way such a file can be wrong, refused at its line and
//! column.

use aerostrata::model::sounding_io::{read_csv, read_winds_csv, Options};
use aerostrata::{Altitude, GeopotentialAltitude};

/// The knot, m/s: 1852 m per hour (exact by definition; NIST SP 811, Appendix B).
const KNOT: f64 = 1852.0 / 3600.0;

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() <= 1e-12 * b.abs().max(1.0)
}

#[test]
fn a_sounding_carries_its_winds_against_geometric_altitude() {
    // An invented morning sounding over a coastal range: a light westerly at the surface
    // veering to a south-westerly jet aloft; the 1500 m level has no wind report.
    let text = "geopotential_altitude_m,temperature_degC,pressure_hPa,wind_speed_kt,wind_direction_deg\n\
                0,15,1013.25,10,270\n\
                1500,5.25,845.6,,\n\
                3000,-4.5,701.2,40,225\n";
    let sounding = read_csv(text, &Options::default()).unwrap();
    assert!(sounding.ignored.is_empty());
    let winds = sounding.winds.expect("the sounding has winds");
    let levels = winds.levels();
    assert_eq!(levels.len(), 2, "the row without a wind report gives no level");
    // 10 kt from 270 deg blows toward the east: east = +10 kt, north = 0 (the
    // meteorological convention; common practice, no source).
    assert!(close(levels[0].east_m_s, 10.0 * KNOT) && levels[0].north_m_s.abs() < 1e-12);
    // 40 kt from 225 deg (south-west) blows toward the north-east: each component is
    // 40 kt * sin(45 deg) = 40 kt / sqrt(2).
    let component = 40.0 * KNOT / 2f64.sqrt();
    assert!(close(levels[1].east_m_s, component) && close(levels[1].north_m_s, component));
    // The altitudes are geometric: 3000 geopotential metres is z = r0 H / (r0 - H)
    // (U.S. Standard Atmosphere 1976, eq. 18) with r0 = 6 356 766 m.
    let r0 = 6_356_766.0;
    assert!(close(levels[1].altitude_m, r0 * 3000.0 / (r0 - 3000.0)));
    let z = GeopotentialAltitude::new(3000.0).unwrap().to_geometric().meters();
    assert_eq!(levels[1].altitude_m, z);
    // The profile is linear in each component between levels and held beyond them.
    let mid = winds.at(z / 2.0).unwrap();
    assert!(close(mid.east_m_s, (10.0 * KNOT + component) / 2.0) && !mid.held);
    assert!(winds.at(20_000.0).unwrap().held);
    // The model itself is the same as without the wind columns.
    let bare = "geopotential_altitude_m,temperature_degC,pressure_hPa\n0,15,1013.25\n1500,5.25,845.6\n3000,-4.5,701.2\n";
    let without = read_csv(bare, &Options::default()).unwrap();
    use aerostrata::Atmosphere;
    let at = Altitude::geometric_m(2000.0).unwrap();
    assert_eq!(sounding.table.state(at).unwrap(), without.table.state(at).unwrap());
}

#[test]
fn components_and_a_wind_file_of_its_own() {
    let sounding =
        "geometric_altitude (ft),temperature (K),pressure (Pa),wind_east (ft/s),wind_north (ft/s)\n\
                    0,288.15,101325,10,-20\n3280.84,281.65,89875,,\n";
    let winds = read_csv(sounding, &Options::default()).unwrap().winds.unwrap();
    // The international foot, 0.3048 m exactly (NIST SP 811, Appendix B).
    assert_eq!(winds.levels()[0].east_m_s, 10.0 * 0.3048);
    assert_eq!(winds.levels()[0].north_m_s, -20.0 * 0.3048);
    // A wind file: comments, a semicolon delimiter, a cell's own unit, a remark column
    // kept out and listed.
    let file = "# winds aloft over an invented range, morning of the launch\n\
                geometric_altitude_km;wind_speed_m_s;wind_direction_deg;remark\n\
                0;3;90;gusty\n\
                5;25kt;100;\n\
                12;55;110;jet\n";
    let read = read_winds_csv(file, &Options::default()).unwrap();
    assert_eq!(read.ignored, [(4, "remark".to_owned())]);
    let levels = read.winds.levels();
    assert_eq!(levels.iter().map(|l| l.altitude_m).collect::<Vec<_>>(), [0.0, 5000.0, 12_000.0]);
    // 3 m/s from the east (90 deg) blows toward the west.
    assert!(close(levels[0].east_m_s, -3.0) && levels[0].north_m_s.abs() < 1e-15);
    assert!(close(levels[1].speed_m_s(), 25.0 * KNOT) && close(levels[1].direction_deg(), 100.0));
}

/// Each mistake a person makes in a wind file is refused at its line, column and cell,
/// with the fix in the words.
#[test]
fn every_mistake_is_refused_where_it_is() {
    let cases: [(&str, &[&str]); 9] = [
        ("wind_speed_m_s,wind_direction_deg\n3,90\n", &["line 1", "needs an altitude column"]),
        ("geometric_altitude_m,temperature_K\n0,288\n", &["line 1", "names no wind column"]),
        ("geometric_altitude_m,wind_speed_m_s\n0,3\n", &["line 1", "column 2 (wind_speed_m_s)", "needs a wind_direction"]),
        (
            "geometric_altitude_m,wind_speed_m_s,wind_direction_deg,wind_east_m_s,wind_north_m_s\n0,1,2,3,4\n",
            &["line 1", "not both"],
        ),
        (
            "geometric_altitude_m,wind_speed_m_s,wind_direction_deg\n0,3,90\n\n1000,,180\n",
            &["line 4", "column 2 (wind_speed_m_s)", "give both or neither"],
        ),
        (
            "geometric_altitude_m,wind_speed_m_s,wind_direction_deg\n0,300,90\n",
            &["line 2", "column 2 (wind_speed_m_s)", "value '300'", "wind speed"],
        ),
        (
            "geometric_altitude_m,wind_speed_m_s,wind_direction_deg\n0,3,400\n",
            &["line 2", "column 3 (wind_direction_deg)", "value '400'"],
        ),
        (
            "geometric_altitude_m,wind_speed_m_s,wind_direction_deg\n0,3,90\n2000,4,90\n1000,5,90\n",
            &["line 4", "column 1 (geometric_altitude_m)"],
        ),
        ("geometric_altitude_m,wind_speed_m_s,wind_direction_deg\n0,3kPa,90\n", &["line 2", "column 2", "3kPa"]),
    ];
    for (text, words) in cases {
        let error = read_winds_csv(text, &Options::default()).unwrap_err().to_string();
        for word in words {
            assert!(error.contains(word), "{text:?}: {error:?} lacks {word:?}");
        }
    }
    // A plain altitude is geometric, as in a flight file.
    let plain =
        read_winds_csv("altitude (ft),wind_east (kt),wind_north (kt)\n1000,5,0\n", &Options::default());
    assert_eq!(plain.unwrap().winds.levels()[0].altitude_m, 304.8);
    let both = "altitude_m,geometric_altitude_m,wind_east_m_s,wind_north_m_s\n0,0,1,1\n";
    assert!(read_winds_csv(both, &Options::default())
        .unwrap_err()
        .to_string()
        .contains("one altitude column"));
    // A header alone.
    let error = read_winds_csv("geometric_altitude_m,wind_east_m_s,wind_north_m_s\n", &Options::default());
    assert!(error.unwrap_err().to_string().contains("no row of winds"));
}

/// A sounding that cannot use its wind columns still loads: half a pair is kept out and
/// listed like any column the reader does not take; a sounding's wind errors are placed
/// like its other cells'.
#[test]
fn a_sounding_with_half_a_wind_loads() {
    let text = "geometric_altitude_m,temperature_K,wind_speed_kt,pressure_Pa,remark\n0,288.15,12,101325,calm\n1000,281.65,,89875,\n";
    let sounding = read_csv(text, &Options::default()).unwrap();
    assert!(sounding.winds.is_none());
    assert_eq!(sounding.ignored, [(3, "wind_speed_kt".to_owned()), (5, "remark".to_owned())]);
    let bad = "geometric_altitude_m,temperature_K,pressure_Pa,wind_east_m_s,wind_north_m_s\n\
               0,288.15,101325,1,2\n1000,281.65,89875,1,\n";
    let error = read_csv(bad, &Options::default()).unwrap_err().to_string();
    assert!(error.starts_with("line 3, column 5 (wind_north_m_s)"), "{error}");
    let none = "geometric_altitude_m,temperature_K,pressure_Pa,wind_east_m_s,wind_north_m_s\n0,288.15,101325,,\n1000,281.65,89875,,\n";
    let error = read_csv(none, &Options::default()).unwrap_err().to_string();
    assert!(error.contains("no wind on any row"), "{error}");
}

/// Headings, units and cells are echoed with control characters escaped (a fuzzing
/// finding: they were quoted raw), as the unit parser's own messages do.
#[test]
fn echoed_text_has_no_control_characters() {
    let cases = [
        "geometric_altitude_m,wind_speed (k\u{1}t),wind_direction_deg\n0,3,90\n",
        "geometric_altitude_m,wind_speed_m_s,wind_direction_deg\n0,3\u{7},90\n",
        "geometric_altitude_m,temperature (de\u{1b}[31mC),pressure_Pa\n0,15,101325\n1000,8.5,\n",
        "geometric_altitude_m,temperature_K,pressure_Pa\n0,2\u{0}88,101325\n1000,281.65,\n",
    ];
    for text in cases {
        let messages = [
            read_winds_csv(text, &Options::default()).map(|_| ()).unwrap_err().to_string(),
            read_csv(text, &Options::default()).map(|_| ()).err().map(|e| e.to_string()).unwrap_or_default(),
        ];
        for message in messages {
            assert!(!message.chars().any(char::is_control), "{message:?}");
        }
    }
    // A run of control characters is cut by what it echoes, escapes included (a fuzzing
    // finding: 40 characters of them echoed as 280, twice in one message).
    let run = "\u{1e}".repeat(200);
    let text = format!("geometric_altitude_m,wind_speed_m_s,wind_direction_deg\n0,1{run},90\n");
    let message = read_winds_csv(&text, &Options::default()).unwrap_err().to_string();
    assert!(message.chars().count() < 200, "{} characters: {message}", message.chars().count());
    let header = aerostrata::table::Header::read("temperature (de\u{1}C)", |_| true, |q| q.si());
    let message = header.unwrap_err().to_string();
    assert!(message.contains("de\\u{1}C") && !message.chars().any(char::is_control), "{message:?}");
}
