//! The 1976 standard above 86 km in a build whose tables are loaded at run time
//! (`upper-loadable` without `upper`): every path that reaches the tables says they are
//! not loaded until they are, a wrong file is refused, and the right one makes the same
//! calls succeed with the table's own values.
//!
//! The file is written here from the generated table's source (included below) in the
//! format that model/upper/tables.rs documents, independently of the core's own writer
//! (which needs the `upper` feature).

#![cfg(all(feature = "upper-loadable", not(feature = "upper")))]

use aerostrata::flight::scan;
use aerostrata::inverse::{altitude_of, Property};
use aerostrata::model::upper::{load_tables, tables_loaded, TABLES_FILE_BYTES, TABLES_FORMAT, TABLES_MAGIC};
use aerostrata::{
    Altitude, AltitudeKind, Atmosphere, Error, OutsideTable, Sample, SoundingRow, Tabulated,
    TemperatureOffset, US1976,
};

/// The generated table (`LN_DENSITY`, `SLOPE`), data only.
mod generated {
    include!("../src/model/upper/upper_table.rs");
}

fn tables_file() -> Vec<u8> {
    let mut file = Vec::from(TABLES_MAGIC);
    file.extend(TABLES_FORMAT.to_le_bytes());
    generated::LN_DENSITY.iter().flatten().for_each(|v| file.extend(v.to_le_bytes()));
    generated::SLOPE.iter().flatten().for_each(|v| file.extend(v.to_le_bytes()));
    file
}

fn at(z_m: f64) -> Altitude {
    Altitude::geometric_m(z_m).unwrap()
}

/// What every path above 86 km gives before the tables are loaded: the error, or the
/// values after.
fn paths_above_86_km() -> [Result<f64, Error>; 7] {
    let offset = TemperatureOffset::new(US1976, 15.0).unwrap();
    // A sounding from 0 to 30 km on the standard's own pressures (U.S. Standard Atmosphere
    // 1976, Table I, from memory: 101 325 Pa, 1197.0 Pa at 30 km), blending into the
    // standard above its top.
    let rows = [
        SoundingRow::new(0.0, 288.15).with_pressure_pa(101_325.0),
        SoundingRow::new(30_000.0, 226.51).with_pressure_pa(1197.0),
    ];
    let sounding = Tabulated::from_rows_vec(AltitudeKind::Geometric, &rows)
        .unwrap()
        .with_above(OutsideTable::BlendIntoUs1976 { depth_m: 5_000.0 })
        .unwrap();
    // A flight from 80 to 120 km: the scan needs the air at every sample.
    let samples = [0.0, 1.0, 2.0].map(|t| Sample {
        time_s: t,
        altitude_m: 80_000.0 + 20_000.0 * t,
        velocity_m_s: 1500.0,
    });
    [
        US1976.state(at(120_000.0)).map(|s| s.pressure_pa),
        US1976.species(at(200_000.0)).map(|n| n.o_m3),
        offset.state(at(150_000.0)).map(|s| s.temperature_k),
        sounding.state(at(100_000.0)).map(|s| s.density_kg_m3),
        scan(US1976, None, samples, |_| {}).map(|summary| summary.samples as f64),
        // 1e-6 Pa lies above 86 km (0.37 Pa there; U.S. Standard Atmosphere 1976, Table I).
        altitude_of(&US1976, Property::Pressure, 1e-6).map(|z| z.meters()),
        // Geopotential altitudes reach the upper part too.
        US1976.air(Altitude::geopotential_m(100_000.0).unwrap()).map(|a| a.temperature_k()),
    ]
}

#[test]
fn the_tables_are_refused_when_wrong_and_answer_once_loaded() {
    // Before: a clear error at each path, naming the altitude; at and below 86 km all is well.
    assert!(!tables_loaded());
    let before = paths_above_86_km();
    for (i, result) in before.iter().enumerate() {
        assert!(matches!(result, Err(Error::UpperNotLoaded { .. })), "path {i}: {result:?}");
    }
    assert_eq!(before[0], Err(Error::UpperNotLoaded { altitude_m: 120_000.0 }));
    let message = before[0].unwrap_err().to_string();
    assert!(
        message.contains("120000 m") && message.contains("86 km") && message.contains("load_tables"),
        "{message}"
    );
    assert!(US1976.state(at(86_000.0)).is_ok());
    assert_eq!(US1976.range().geometric_max_m, 1_000_000.0);
    assert!(matches!(US1976.state(at(1_000_001.0)), Err(Error::OutOfRange { .. })));

    // Wrong files: refused, and nothing is loaded.
    let file = tables_file();
    assert_eq!(file.len(), TABLES_FILE_BYTES);
    let mut changed = file.clone();
    changed[5000] ^= 0x10;
    for wrong in [&file[..100], &changed[..], b"not a table".as_slice()] {
        assert!(matches!(load_tables(wrong), Err(Error::UpperTablesRefused { .. })));
    }
    assert!(!tables_loaded());
    assert!(US1976.state(at(120_000.0)).is_err());

    // The right file: loaded, and loading again is harmless.
    load_tables(&file).unwrap();
    load_tables(&file).unwrap();
    assert!(tables_loaded());
    for (i, result) in paths_above_86_km().iter().enumerate() {
        let value = result.unwrap_or_else(|e| panic!("path {i}: {e}"));
        assert!(value.is_finite() && value > 0.0, "path {i}: {value}");
    }
    // At a node the interpolant is the stored value: the loaded table is read to the bit.
    // 100 km is the last node (index 49) of the run from 97 km (upper_layout.rs).
    let n = US1976.species(at(100_000.0)).unwrap();
    assert_eq!(n.n2_m3.to_bits(), libm::exp(generated::LN_DENSITY[49][0]).to_bits());
    assert_eq!(n.he_m3.to_bits(), libm::exp(generated::LN_DENSITY[49][4]).to_bits());
    // Between nodes the slopes count: at 212 345 m, in the run from 200 km by 5 km whose
    // first node is index 179 (upper_layout.rs), the cubic Hermite interpolant of the
    // loaded values and slopes, written out here as the core evaluates it (interval 2,
    // u = 0.469; hand-worked), is what the model gives, to the bit.
    let (z, start, step, first) = (212_345.0, 200_000.0, 5_000.0, 179);
    let position: f64 = (z - start) / step;
    let interval = position as usize;
    let u = position - interval as f64;
    let (u2, u3) = (u * u, u * u * u);
    let (h00, h10, h01, h11) = (2.0 * u3 - 3.0 * u2 + 1.0, u3 - 2.0 * u2 + u, -2.0 * u3 + 3.0 * u2, u3 - u2);
    let (y0, y1) = (generated::LN_DENSITY[first + interval], generated::LN_DENSITY[first + interval + 1]);
    let (d0, d1) = (generated::SLOPE[first + interval], generated::SLOPE[first + interval + 1]);
    let n = US1976.species(at(z)).unwrap().as_array();
    for i in 0..6 {
        let ln_n = h00 * y0[i] + h01 * y1[i] + step * (h10 * f64::from(d0[i]) + h11 * f64::from(d1[i]));
        assert_eq!(n[i].to_bits(), libm::exp(ln_n).to_bits(), "species {i}");
    }
    // And the standard's values (U.S. Standard Atmosphere 1976, Table I, as
    // tests/vectors/usa76_upper.csv gives them): 120 km 360.00 K, 2.5382E-03 Pa;
    // 200 km 8.4736E-05 Pa, 2.541E-10 kg/m^3.
    let s = US1976.state(at(120_000.0)).unwrap();
    assert!((s.temperature_k - 360.0).abs() < 0.005 && (s.pressure_pa / 2.5382e-3 - 1.0).abs() < 1e-4);
    let s = US1976.state(at(200_000.0)).unwrap();
    assert!(
        (s.pressure_pa / 8.4736e-5 - 1.0).abs() < 1e-4 && (s.density_kg_m3 / 2.541e-10 - 1.0).abs() < 1e-3
    );
}
