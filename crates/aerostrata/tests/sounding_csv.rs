//! The sounding loader (`model::sounding_io`): every validation error of the model, and
//! the loader's own, from a malformed CSV, each naming the line, the column and the cell
//! as written; and the units it converts.

use aerostrata::model::sounding_io::parse_csv;

mod common;
use common::relative;

/// The loader must refuse `text`, with a message that contains every one of `words`.
fn assert_csv_error(text: &str, words: &[&str]) {
    let message = parse_csv(text).map(|_| ()).unwrap_err().to_string();
    for word in words {
        assert!(message.contains(word), "{message:?} should contain {word:?}");
    }
}

const HEADER: &str =
    "# invented test data\ngeometric_altitude_m,temperature_degC,pressure_hPa,dew_point_degC\n";

#[test]
fn fewer_than_two_rows() {
    assert_csv_error(&format!("{HEADER}0,30,1010,24\n"), &["line 2", "a table needs at least 2 rows, got 1"]);
}

#[test]
fn altitudes_not_increasing() {
    assert_csv_error(
        &format!("{HEADER}0,30,1010,24\n1000,24,900,20\n1000,20,850,15\n"),
        &[
            "line 5",
            "column 1 (geometric_altitude_m)",
            "value '1000'",
            "row 2: altitude 1000 m must be at least",
        ],
    );
}

#[test]
fn temperature_at_or_below_zero_kelvin() {
    assert_csv_error(
        &format!("{HEADER}0,30,1010,24\n1000,-300,900,\n"),
        &["line 4", "column 2 (temperature_degC)", "value '-300'", "temperature must be above 0 K"],
    );
}

#[test]
fn pressure_not_positive() {
    assert_csv_error(
        &format!("{HEADER}0,30,1010,24\n1000,24,0,\n"),
        &["line 4", "column 3 (pressure_hPa)", "value '0'", "pressure must be greater than 0 Pa"],
    );
}

#[test]
fn density_not_positive() {
    let text = "geopotential_altitude_ft,temperature_K,density_kg_m3\n0,300,1.17\n3000,294,-1.05\n";
    assert_csv_error(
        text,
        &["line 3", "column 3 (density_kg_m3)", "value '-1.05'", "density must be greater than 0"],
    );
}

#[test]
fn pressure_not_decreasing() {
    assert_csv_error(
        &format!("{HEADER}0,30,1010,24\n1000,24,1010.5,\n"),
        &["line 4", "column 3 (pressure_hPa)", "value '1010.5'", "must be below the previous row's"],
    );
}

#[test]
fn derived_pressure_not_decreasing() {
    // Densities whose pressures (rho R T) rise: 1.0 kg/m^3 at 300 K is above 1.2 at 240 K.
    let text = "geometric_altitude_m,temperature_K,density_kg_m3\n0,240,1.2\n100,300,1.0\n";
    assert_csv_error(
        text,
        &["line 3", "column 3 (density_kg_m3)", "value '1.0'", "must be below the previous"],
    );
}

#[test]
fn relative_humidity_outside_0_to_100() {
    let text = "geometric_altitude_m,temperature_degC,pressure_hPa,relative_humidity_percent\n0,30,1010,70\n1000,24,900,101\n";
    assert_csv_error(
        text,
        &[
            "line 3",
            "column 4 (relative_humidity_percent)",
            "value '101'",
            "outside the allowed range 0 to 100 %",
        ],
    );
    let text = "geometric_altitude_m,temperature_degC,pressure_hPa,relative_humidity_percent\n0,30,1010,-0.5\n1000,24,900,\n";
    assert_csv_error(text, &["line 2", "value '-0.5'", "relative humidity -0.5 %"]);
}

#[test]
fn dew_point_above_temperature() {
    assert_csv_error(
        &format!("{HEADER}0,25,1010,26\n1000,24,900,\n"),
        &["line 3", "column 4 (dew_point_degC)", "value '26'", "must not be above the temperature"],
    );
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
            &format!("{HEADER}0,30,1010,24\n{cells}\n"),
            &["line 4", column, &format!("value '{value}'"), "must be a finite number"],
        );
    }
}

#[test]
fn feet_read_as_metres_break_hydrostatic_balance() {
    // Altitudes in feet under a metre header: the pressures fall 3.3 times too fast.
    let text = "geometric_altitude_m,temperature_degC,pressure_hPa\n0,30,1010\n3281,23.5,898.6\n";
    assert_csv_error(
        text,
        &[
            "line 3",
            "column 3 (pressure_hPa)",
            "value '898.6'",
            "rows 0 and 1",
            "the allowed range is 0.5 to 2",
        ],
    );
}

#[test]
fn mixed_or_missing_columns() {
    let text = "geometric_altitude_m,temperature_K,pressure_Pa,density_kg_m3\n0,300,100000,\n100,299,,1.15\n";
    assert_csv_error(text, &["line 3", "row 1: gives a density, but the first row gives a pressure"]);
    let text = "geometric_altitude_m,temperature_K,pressure_Pa\n0,300,100000\n100,299,98900\n200,298,\n";
    assert_csv_error(text, &["line 4", "row 2: gives no pressure, but the rows before it do"]);
    let text = "geometric_altitude_m,temperature_K,pressure_Pa\n0,300,\n100,299,\n";
    assert_csv_error(text, &["line 2", "the first row must give a pressure or a density"]);
    let text = "geometric_altitude_m,temperature_K,pressure_Pa,dew_point_K,relative_humidity_percent\n0,300,1e5,290,50\n100,299,,,\n";
    assert_csv_error(text, &["line 2", "both a dew point and a relative humidity"]);
}

#[test]
fn humidity_outside_the_saturation_formulas_band() {
    assert_csv_error(
        &format!("{HEADER}0,75,1010,24\n1000,24,900,\n"),
        &["line 3", "column 2 (temperature_degC)", "value '75'", "temperature of a row with humidity"],
    );
}

#[test]
fn vapour_pressure_above_the_pressure() {
    // 55 degC and saturated at 100 hPa: the vapour alone would be 157 hPa.
    assert_csv_error(
        &format!("{HEADER}0,55,100,55\n1000,50,90,\n"),
        &[
            "line 3",
            "column 4 (dew_point_degC)",
            "value '55'",
            "vapour pressure",
            "must be below the pressure",
        ],
    );
}

#[test]
fn malformed_text() {
    assert_csv_error("# only a comment\n", &["line 1", "no header line"]);
    assert_csv_error(
        "altitude_m,temperature_K,pressure_Pa\n",
        &["line 1", "column 1 (altitude_m)", "say which altitude"],
    );
    assert_csv_error(
        "geometric_altitude_m,temperature_C,pressure_Pa\n",
        &["line 1", "column 2 (temperature_C)", "unit 'C' is not one of K, degC, degF"],
    );
    assert_csv_error(
        "geometric_altitude_m,temperature_K,wind_kt\n",
        &["column 3 (wind_kt)", "unknown column"],
    );
    assert_csv_error(
        "geometric_altitude_m,temperature_K,pressure_Pa,pressure_hPa\n",
        &["column 4 (pressure_hPa)", "a second column of this quantity (the first is column 3)"],
    );
    assert_csv_error("geometric_altitude_m,pressure_Pa\n", &["line 1", "needs a temperature column"]);
    assert_csv_error("geometric_altitude_m,temperature_K\n", &["needs a pressure"]);
    assert_csv_error(
        &format!("{HEADER}0,30,1010\n"),
        &["line 3", "3 cells, but the header on line 2 has 4 columns"],
    );
    assert_csv_error(
        &format!("{HEADER}0,thirty,1010,\n"),
        &["line 3", "column 2 (temperature_degC)", "value 'thirty'", "not a number"],
    );
    assert_csv_error(
        &format!("{HEADER}0,,1010,\n"),
        &["line 3", "column 2 (temperature_degC)", "a value is required"],
    );
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
