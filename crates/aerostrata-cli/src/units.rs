//! `--units si|us`: which of its two units from the core's catalogue each quantity is
//! written in (and read in, from a file whose heading and value name none; an option's
//! value is always in its own unit or SI). Nothing here knows a unit or a factor: the
//! unit of a quantity is
//! [`Quantity::si`] or [`Quantity::us`], and every conversion is the core's
//! ([`aerostrata::units`]), at the edge, so that the core only ever sees SI.

use aerostrata::units::Unit;
use aerostrata::Quantity;

/// Which of each quantity's units a command writes (and reads from files).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default, clap::ValueEnum)]
pub enum UnitSystem {
    /// SI, what the core computes in: m, m/s, K, Pa, kg/m3.
    #[default]
    Si,
    /// US customary: ft, ft/s (airspeeds in kt), degF, psf (altimetry in inHg), slug/ft3,
    /// lbf.
    Us,
}

impl UnitSystem {
    /// The unit of `quantity` in this system.
    pub fn unit(self, quantity: Quantity) -> &'static Unit {
        match self {
            UnitSystem::Si => quantity.si(),
            UnitSystem::Us => quantity.us(),
        }
    }

    /// `si` (in the SI unit of `quantity`) in this system's unit of it.
    pub fn from_si(self, quantity: Quantity, si: f64) -> f64 {
        self.unit(quantity).from_si(si)
    }

    /// `value` (in this system's unit of `quantity`) in SI.
    pub fn to_si(self, quantity: Quantity, value: f64) -> f64 {
        self.unit(quantity).to_si(value)
    }

    /// The CSV and JSON column of `quantity` in this system (`temperature_degF`).
    pub fn column(self, quantity: Quantity) -> String {
        column(quantity, self.unit(quantity))
    }
}

/// The CSV and JSON column of `quantity` in `unit`: its machine name, `_` and the unit's
/// suffix (`speed_of_sound_m_s`); the name alone for a pure number (`mach`).
pub fn column(quantity: Quantity, unit: &Unit) -> String {
    unit.key(quantity.name())
}

/// `quantity` in `unit` for a message: its label and the unit's symbol (`geometric
/// altitude in ft`); the label alone for a pure number.
pub fn in_words(quantity: Quantity, unit: &Unit) -> String {
    let label = quantity.info().label;
    match unit.symbol() {
        "" => label.to_owned(),
        symbol => format!("{label} in {symbol}"),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn each_system_takes_the_catalogues_unit() {
        for quantity in Quantity::ALL.iter().copied() {
            assert_eq!(UnitSystem::Si.unit(quantity), quantity.info().si);
            assert_eq!(UnitSystem::Us.unit(quantity), quantity.info().us);
        }
        assert_eq!(UnitSystem::Si.column(Quantity::Pressure), "pressure_Pa");
        assert_eq!(UnitSystem::Us.column(Quantity::Temperature), "temperature_degF");
        assert_eq!(UnitSystem::Us.column(Quantity::Mach), "mach");
        // The 1976 standard's sea level, 101 325 Pa, is 29.9213 inHg (from memory of the
        // standard's English-unit table); the conversion is the core's.
        let inhg = UnitSystem::Us.from_si(Quantity::StaticPressure, 101_325.0);
        assert!((inhg - 29.9213).abs() < 1e-4, "{inhg}");
        assert_eq!(UnitSystem::Si.to_si(Quantity::Pressure, 101_325.0), 101_325.0);
        assert_eq!(
            in_words(Quantity::GeometricAltitude, Quantity::GeometricAltitude.us()),
            "geometric altitude in ft"
        );
        assert_eq!(in_words(Quantity::Mach, Quantity::Mach.si()), "Mach number");
    }
}
