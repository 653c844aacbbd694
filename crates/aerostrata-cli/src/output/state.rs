//! The columns of a full state (and of the standard's species) and a state's values in
//! them, for `table` and `eval`: the catalogue's state quantities, in its order, each read
//! by [`State::get`].

use aerostrata::model::upper::Species;
use aerostrata::quantity::Group;
use aerostrata::units::Unit;
use aerostrata::{Quantity, State};

use crate::output::rows::Column;
use crate::units::UnitSystem;

/// The state's columns, and with `species` the standard's number densities.
pub fn state_columns(units: UnitSystem, species: bool) -> Vec<Column> {
    let species = species.then(|| Quantity::of_group(Group::Species));
    Quantity::of_group(Group::State)
        .chain(species.into_iter().flatten())
        .map(|q| Column::of(units, q))
        .collect()
}

/// A state's values in `units`, and with `species` the standard's number densities
/// (`Some(None)`: empty cells, below 86 km where the standard gives none). An empty cell
/// also stands for a quantity the model leaves undefined (the speed of sound and the
/// viscosities above 86 km).
pub fn state_values(state: &State, units: UnitSystem, species: Option<Option<&Species>>) -> Vec<Option<f64>> {
    let mut values = Vec::new();
    StateUnits::new(units).values_into(&mut values, state, species);
    values
}

/// The state's quantities (and the species') with the unit each is written in, looked up
/// once for a stream of rows rather than for every value.
pub struct StateUnits {
    state: Vec<(Quantity, &'static Unit)>,
    species: Vec<(Quantity, &'static Unit)>,
}

impl StateUnits {
    /// The units of `units` for every state and species quantity.
    pub fn new(units: UnitSystem) -> Self {
        let with_unit = |q: Quantity| (q, units.unit(q));
        StateUnits {
            state: Quantity::of_group(Group::State).map(with_unit).collect(),
            species: Quantity::of_group(Group::Species).map(with_unit).collect(),
        }
    }

    /// [`state_values`] into `values` (cleared first): a streaming command reuses one
    /// buffer.
    pub fn values_into(
        &self,
        values: &mut Vec<Option<f64>>,
        state: &State,
        species: Option<Option<&Species>>,
    ) {
        values.clear();
        values.extend(self.state.iter().map(|(q, unit)| state.get(*q).ok().map(|v| unit.from_si(v))));
        if let Some(species) = species {
            // The core gives the species as an array in the catalogue's order (a test checks
            // it): it has no `get` of its own.
            let densities = species.map(Species::as_array);
            let units = self.species.iter().enumerate();
            values.extend(units.map(|(i, (_, unit))| densities.map(|n| unit.from_si(n[i]))));
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use aerostrata::{Altitude, Atmosphere, US1976};

    #[test]
    fn columns_follow_the_state_fields() {
        let state = US1976.state(Altitude::geometric_m(0.0).unwrap()).unwrap();
        let columns = state_columns(UnitSystem::Si, false);
        assert_eq!(columns.len(), state.fields().len());
        for (column, (field, _)) in columns.iter().zip(state.fields()) {
            assert_eq!(column.key.to_lowercase(), field, "column {} against field {field}", column.key);
        }
    }

    /// The species' catalogue quantities and the core's array are in the same order: each
    /// quantity's name (`n_N2`) is its field's (`n2_m3`) in another spelling.
    #[test]
    fn species_arrays_follow_the_catalogue() {
        let species = US1976.species(Altitude::geometric_m(500_000.0).unwrap()).unwrap();
        let fields = serde_json::to_value(species).unwrap();
        let fields: Vec<&String> = fields.as_object().unwrap().keys().collect();
        let quantities: Vec<Quantity> = Quantity::of_group(Group::Species).collect();
        assert_eq!(fields.len(), quantities.len());
        assert_eq!(species.as_array().len(), quantities.len());
        for (field, quantity) in fields.iter().zip(&quantities) {
            let species = quantity.name().strip_prefix("n_").unwrap().to_lowercase();
            assert_eq!(**field, format!("{species}_{}", quantity.si().suffix()));
        }
        let values = state_values(
            &US1976.state(Altitude::geometric_m(500_000.0).unwrap()).unwrap(),
            UnitSystem::Si,
            Some(Some(&species)),
        );
        assert_eq!(values[values.len() - quantities.len()..], species.as_array().map(Some));
    }
}
