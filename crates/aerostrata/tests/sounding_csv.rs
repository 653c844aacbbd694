//! The sounding loader (`model::sounding_io`): every validation error of the model, and
//! the loader's own, from a malformed CSV, each naming the line, the column and the cell
//! as written; and the units it converts.

use aerostrata::model::sounding_io::{parse_csv, read_csv, Options};

mod common;
use common::relative;

/// The loader must refuse `text` (the `case` it stands for), with a message that contains
/// every one of `words`.
fn assert_csv_error(case: &str, text: &str, words: &[&str]) {
    let message = parse_csv(text).map(|_| ()).expect_err(case).to_string();
    for word in words {
        assert!(message.contains(word), "{case}: {message:?} should contain {word:?}");
    }
}

const HEADER: &str =
    "# invented test data\ngeometric_altitude_m,temperature_degC,pressure_hPa,dew_point_degC\n";

/// Every row error of the model, each with the words its message must hold: the line,
/// the column and the cell as written, and the rule the cell breaks.
#[test]
fn each_row_error_names_its_line_column_and_cell() {
    let humidity_header = "geometric_altitude_m,temperature_degC,pressure_hPa,relative_humidity_percent\n";
    let cases: [(&str, String, &[&str]); 13] = [
        (
            "fewer than two rows",
            format!("{HEADER}0,30,1010,24\n"),
            &["line 2", "a table needs at least 2 rows, got 1"],
        ),
        (
            "altitudes not increasing",
            format!("{HEADER}0,30,1010,24\n1000,24,900,20\n1000,20,850,15\n"),
            &[
                "line 5",
                "column 1 (geometric_altitude_m)",
                "value '1000'",
                "row 2: altitude 1000 m must be at least",
            ],
        ),
        (
            "temperature at or below 0 K",
            format!("{HEADER}0,30,1010,24\n1000,-300,900,\n"),
            &["line 4", "column 2 (temperature_degC)", "value '-300'", "temperature must be above 0 K"],
        ),
        (
            "pressure not positive",
            format!("{HEADER}0,30,1010,24\n1000,24,0,\n"),
            &["line 4", "column 3 (pressure_hPa)", "value '0'", "pressure must be greater than 0 Pa"],
        ),
        (
            "density not positive",
            "geopotential_altitude_ft,temperature_K,density_kg_m3\n0,300,1.17\n3000,294,-1.05\n".to_owned(),
            &["line 3", "column 3 (density_kg_m3)", "value '-1.05'", "density must be greater than 0"],
        ),
        (
            "pressure not decreasing",
            format!("{HEADER}0,30,1010,24\n1000,24,1010.5,\n"),
            &["line 4", "column 3 (pressure_hPa)", "value '1010.5'", "must be below the previous row's"],
        ),
        (
            // Densities whose pressures (rho R T) rise: 1.0 kg/m^3 at 300 K is above 1.2 at 240 K.
            "derived pressure not decreasing",
            "geometric_altitude_m,temperature_K,density_kg_m3\n0,240,1.2\n100,300,1.0\n".to_owned(),
            &["line 3", "column 3 (density_kg_m3)", "value '1.0'", "must be below the previous"],
        ),
        (
            "relative humidity above 100 %",
            format!("{humidity_header}0,30,1010,70\n1000,24,900,101\n"),
            &[
                "line 3",
                "column 4 (relative_humidity_percent)",
                "value '101'",
                "outside the allowed range 0 to 100 %",
            ],
        ),
        (
            "relative humidity below 0 %",
            format!("{humidity_header}0,30,1010,-0.5\n1000,24,900,\n"),
            &["line 2", "value '-0.5'", "relative humidity -0.5 %"],
        ),
        (
            "dew point above the temperature",
            format!("{HEADER}0,25,1010,26\n1000,24,900,\n"),
            &["line 3", "column 4 (dew_point_degC)", "value '26'", "must not be above the temperature"],
        ),
        (
            // Altitudes in feet under a metre header: the pressures fall 3.3 times too fast.
            "feet read as metres break hydrostatic balance",
            "geometric_altitude_m,temperature_degC,pressure_hPa\n0,30,1010\n3281,23.5,898.6\n".to_owned(),
            &[
                "line 3",
                "column 3 (pressure_hPa)",
                "value '898.6'",
                "rows 0 and 1",
                "the allowed range is 0.5 to 2",
            ],
        ),
        (
            "humidity outside the saturation formulas' band",
            format!("{HEADER}0,75,1010,24\n1000,24,900,\n"),
            &["line 3", "column 2 (temperature_degC)", "value '75'", "temperature of a row with humidity"],
        ),
        (
            // 55 degC and saturated at 100 hPa: the vapour alone would be 157 hPa.
            "vapour pressure above the pressure",
            format!("{HEADER}0,55,100,55\n1000,50,90,\n"),
            &[
                "line 3",
                "column 4 (dew_point_degC)",
                "value '55'",
                "vapour pressure",
                "must be below the pressure",
            ],
        ),
    ];
    for (case, text, words) in &cases {
        assert_csv_error(case, text, words);
    }
}

#[test]
fn nan_and_infinity_anywhere() {
    for (cells, column, value) in [
        ("nan,24,900,", "column 1 (geometric_altitude_m)", "nan"),
        ("1000,inf,900,", "column 2 (temperature_degC)", "inf"),
        ("1000,24,NaN,", "column 3 (pressure_hPa)", "NaN"),
        ("1000,24,900,-infinity", "column 4 (dew_point_degC)", "-infinity"),
    ] {
        assert_csv_error(
            value,
            &format!("{HEADER}0,30,1010,24\n{cells}\n"),
            &["line 4", column, &format!("value '{value}'"), "is not a number"],
        );
    }
}

#[test]
fn mixed_or_missing_columns() {
    let cases: [(&str, &str, &[&str]); 4] = [
        (
            "a density below a pressure",
            "geometric_altitude_m,temperature_K,pressure_Pa,density_kg_m3\n0,300,100000,\n100,299,,1.15\n",
            &["line 3", "row 1: gives a density, but the first row gives a pressure"],
        ),
        (
            "a pressure missing after pressures",
            "geometric_altitude_m,temperature_K,pressure_Pa\n0,300,100000\n100,299,98900\n200,298,\n",
            &["line 4", "row 2: gives no pressure, but the rows before it do"],
        ),
        (
            "no pressure on the first row",
            "geometric_altitude_m,temperature_K,pressure_Pa\n0,300,\n100,299,\n",
            &["line 2", "the first row must give a pressure or a density"],
        ),
        (
            "a dew point and a relative humidity",
            "geometric_altitude_m,temperature_K,pressure_Pa,dew_point_K,relative_humidity_percent\n\
             0,300,1e5,290,50\n100,299,,,\n",
            &["line 2", "both a dew point and a relative humidity"],
        ),
    ];
    for (case, text, words) in cases {
        assert_csv_error(case, text, words);
    }
}

#[test]
fn malformed_text() {
    let short_row = format!("{HEADER}0,30,1010\n");
    let word_for_number = format!("{HEADER}0,thirty,1010,\n");
    let empty_temperature = format!("{HEADER}0,,1010,\n");
    let cases: [(&str, &str, &[&str]); 11] = [
        ("no header", "# only a comment\n", &["line 1", "no header line"]),
        (
            "an altitude of no kind",
            "altitude_m,temperature_K,pressure_Pa\n",
            &["line 1", "column 1 (altitude_m)", "say which altitude"],
        ),
        (
            "an unknown unit",
            "geometric_altitude_m,temperature_Q,pressure_Pa\n",
            &[
                "line 1",
                "column 2 (temperature_Q)",
                "unit 'Q' is not one of the temperature's: K, degC, degF or degR",
            ],
        ),
        (
            "a unit of another quantity",
            "geometric_altitude_m,temperature_K,pressure_ft\n",
            &["line 1", "column 3 (pressure_ft)", "unit 'ft' is not one of the pressure's: Pa, hPa"],
        ),
        (
            "both kinds of altitude",
            "geometric_altitude_m,geopotential_altitude_m,temperature_K,pressure_Pa\n",
            &["line 1", "one altitude column, geometric or geopotential, not both"],
        ),
        (
            "a quantity twice",
            "geometric_altitude_m,temperature_K,pressure_Pa,pressure_hPa\n",
            &["column 4 (pressure_hPa)", "a second column of the pressure (the first is column 3)"],
        ),
        ("no temperature", "geometric_altitude_m,pressure_Pa\n", &["line 1", "needs a temperature column"]),
        ("no pressure or density", "geometric_altitude_m,temperature_K\n", &["needs a pressure"]),
        ("a short row", &short_row, &["line 3", "3 cells, but the header on line 2 has 4 columns"]),
        (
            "a word for a number",
            &word_for_number,
            &["line 3", "column 2 (temperature_degC)", "value 'thirty'", "not a number"],
        ),
        (
            "an empty temperature",
            &empty_temperature,
            &["line 3", "column 2 (temperature_degC)", "a value is required"],
        ),
    ];
    for (case, text, words) in cases {
        assert_csv_error(case, text, words);
    }
}

/// Columns the reader does not take (half a wind, remarks) are kept out and listed; headings
/// in every spelling; a cell's own unit wins over its column's.
#[test]
fn unknown_columns_are_kept_out_and_headings_read_in_every_spelling() {
    let text = "Geometric Altitude [ft];temperature (degC);pressure_hPa;wind_speed_kt;remark\n\
                0;30;1010;12;calm\n3280.84;23.5;900hPa;20;\n";
    let sounding = read_csv(text, &Options::default()).unwrap();
    assert_eq!(sounding.ignored, [(4, "wind_speed_kt".to_owned()), (5, "remark".to_owned())]);
    let row = *sounding.table.rows().nth(1).unwrap();
    assert_eq!(row.altitude_m, 3280.84 * 0.3048);
    assert_eq!(row.pressure_pa, Some(90_000.0));
    // A heading without a unit reads in the reader's default: SI, or what a door passes.
    let bare = "geometric_altitude,temperature,pressure\n0,288.15,101325\n1000,281.65,89875\n";
    assert_eq!(parse_csv(bare).unwrap().levels()[1].pressure_pa(), 89_875.0);
    let us = Options { default_unit: aerostrata::Quantity::us, ..Options::default() };
    let feet = "geometric_altitude,temperature_K,pressure_Pa\n0,288.15,101325\n3280.84,281.65,89875\n";
    assert_eq!(read_csv(feet, &us).unwrap().table.rows().nth(1).unwrap().altitude_m, 3280.84 * 0.3048);
}

/// Gross unit errors, the mistakes a person makes with a column's unit, are refused with
/// the mix-up named (the numbers from the examples in the robustness issue: pascals in a
/// hectopascal column, hectopascals in a pascal column, kelvins in a Celsius column).
#[test]
fn gross_unit_errors_are_refused_naming_the_mix_up() {
    let cases: [(&str, &str, &[&str]); 4] = [
        (
            "pascals in pressure_hPa",
            "geometric_altitude_m,temperature_degC,pressure_hPa\n0,15,101325\n1000,8.5,89875\n",
            &[
                "line 2",
                "column 3 (pressure_hPa)",
                "value '101325'",
                "outside 0.5 to 1.5 times the standard's pressure",
                "if it holds Pa, head it pressure_Pa",
            ],
        ),
        (
            "hectopascals in pressure_Pa",
            "geometric_altitude_m,temperature_degC,pressure_Pa\n0,15,1013.25\n1000,8.5,898.75\n",
            &["line 2", "column 3 (pressure_Pa)", "value '1013.25'", "if it holds hPa, head it pressure_hPa"],
        ),
        (
            "kelvins in temperature_degC",
            "geometric_altitude_m,temperature_degC,pressure_hPa\n0,288.15,1013.25\n1000,281.65,898.75\n",
            &[
                "line 2",
                "column 2 (temperature_degC)",
                "value '288.15'",
                "outside any air temperature",
                "if it holds K, head it temperature_K",
            ],
        ),
        (
            "a density a hundred times too high",
            "geometric_altitude_m,temperature_K,density_kg_m3\n0,288.15,122.5\n1000,281.65,111.2\n",
            &["line 2", "column 3 (density_kg_m3)", "outside 0.5 to 2 times the standard's density"],
        ),
    ];
    for (case, text, words) in cases {
        assert_csv_error(case, text, words);
        // The check can be turned off for unusual use (a test atmosphere).
        let off = Options { plausibility: false, ..Options::default() };
        assert!(read_csv(text, &off).is_ok(), "{case}");
    }
}

#[test]
fn units_are_converted() {
    let text = "\u{feff}# units\r\ngeopotential_altitude_km,temperature_degF,pressure_kPa,relative_humidity_percent\r\n\
                0,86,101,50\r\n\"1\",72.5,89.9,\r\n";
    let table = parse_csv(text).unwrap();
    let level = table.levels()[1];
    assert_eq!(level.geopotential_altitude_m(), 1_000.0);
    assert!((level.temperature_k() - (72.5 + 459.67) * 5.0 / 9.0).abs() < 1e-12);
    assert!(relative(level.pressure_pa(), 89_900.0) <= f64::EPSILON);
    assert!(table.levels()[0].vapour_pressure_pa() > 0.0);
}
