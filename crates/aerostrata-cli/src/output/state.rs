//! The columns of a full state (and of the standard's species) and a state's values in
//! them, in the order of [`State::fields`], for `table`, `eval` and the profile plot.

use aerostrata::State;

use crate::format::Style;
use crate::output::rows::Column;
use crate::units::{Quantity, UnitSystem};

/// The state's columns: (base name, table heading, quantity, rounding, shown in tables),
/// in the order of [`State::fields`].
const STATE: [(&str, &str, Quantity, Style, bool); 20] = [
    ("geometric_altitude", "Z", Quantity::Length, Style::Fixed(1), true),
    ("geopotential_altitude", "H", Quantity::Length, Style::Fixed(1), true),
    ("temperature", "T", Quantity::Temperature, Style::Fixed(3), true),
    ("molecular_temperature", "TM", Quantity::Temperature, Style::Fixed(3), false),
    ("pressure", "p", Quantity::Pressure, Style::Scientific, true),
    ("density", "rho", Quantity::Density, Style::Scientific, true),
    ("speed_of_sound", "a", Quantity::Speed, Style::Fixed(4), true),
    ("dynamic_viscosity", "mu", Quantity::DynamicViscosity, Style::Scientific, true),
    ("kinematic_viscosity", "nu", Quantity::KinematicViscosity, Style::Scientific, true),
    ("thermal_conductivity", "k", Quantity::ThermalConductivity, Style::Scientific, true),
    ("gravity", "g", Quantity::Acceleration, Style::Fixed(4), true),
    ("pressure_scale_height", "Hp", Quantity::Length, Style::Fixed(1), false),
    ("number_density", "n", Quantity::NumberDensity, Style::Scientific, false),
    ("mean_particle_speed", "V", Quantity::Speed, Style::Fixed(2), false),
    ("mean_free_path", "mfp", Quantity::Length, Style::Scientific, true),
    ("collision_frequency", "nu_c", Quantity::Frequency, Style::Scientific, false),
    ("mean_molar_mass", "M", Quantity::MolarMass, Style::Fixed(4), false),
    ("temperature_ratio", "theta", Quantity::Dimensionless, Style::Scientific, false),
    ("pressure_ratio", "delta", Quantity::Dimensionless, Style::Scientific, false),
    ("density_ratio", "sigma", Quantity::Dimensionless, Style::Scientific, false),
];

/// The base name (without unit) and quantity of the state's field `index`.
pub fn state_field(index: usize) -> (&'static str, Quantity) {
    (STATE[index].0, STATE[index].2)
}

/// The species' names, as `eval --species` adds them.
const SPECIES: [&str; 6] = ["N2", "O", "O2", "Ar", "He", "H"];

/// The columns of a state, and with `species` the standard's six number densities.
pub fn state_columns(units: UnitSystem, species: bool) -> Vec<Column> {
    let mut columns: Vec<Column> = STATE
        .iter()
        .map(|&(base, heading, quantity, style, shown)| {
            let column = Column::new(units, base, heading, quantity, style);
            if shown {
                column
            } else {
                column.hidden()
            }
        })
        .collect();
    if species {
        for name in SPECIES {
            columns.push(Column::new(
                units,
                &format!("n_{name}"),
                name,
                Quantity::NumberDensity,
                Style::Scientific,
            ));
        }
    }
    columns
}

/// A state's values in `units`, and with `species` the six number densities (in 1/m^3
/// from the core; `Some(None)` for empty cells below 86 km).
pub fn state_values(state: &State, units: UnitSystem, species: Option<Option<[f64; 6]>>) -> Vec<Option<f64>> {
    let mut values: Vec<Option<f64>> = state
        .fields()
        .iter()
        .enumerate()
        .map(|(index, (_, value))| value.map(|v| units.from_si(STATE[index].2, v)))
        .collect();
    match species {
        Some(Some(n)) => values.extend(n.iter().map(|v| Some(units.from_si(Quantity::NumberDensity, *v)))),
        Some(None) => values.extend([None; 6]),
        None => {}
    }
    values
}

#[cfg(test)]
mod tests {
    use super::*;
    use aerostrata::{Altitude, Atmosphere, US1976};

    #[test]
    fn columns_follow_the_state_fields() {
        let state = US1976.state(Altitude::geometric_m(0.0).unwrap()).unwrap();
        for (column, (field, _)) in state_columns(UnitSystem::Si, false).iter().zip(state.fields()) {
            assert_eq!(column.key.to_lowercase(), field, "column {} against field {field}", column.key);
        }
    }
}
