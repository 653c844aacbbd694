//! The two unit systems of the command line: SI (what the core computes in) and a US
//! customary set, with every factor taken from `aerostrata::constants::units` (exact by
//! definition where the definitions are exact). Conversions happen only here, at the
//! edge: input in the user's units becomes SI before it reaches the core, and SI results
//! become the user's units on the way out.

use aerostrata::constants::units::{
    fahrenheit_to_kelvin, kelvin_to_fahrenheit, CUBIC_FOOT_M3, FOOT_M, FOOT_PER_SECOND_M_S,
    FOOT_PER_SECOND_SQUARED_M_S2, INHG_PA, POUND_FORCE_N, POUND_FORCE_PER_SECOND_RANKINE_W_M_K,
    POUND_FORCE_SECOND_PER_SQUARE_FOOT_PA_S, PSF_PA, RANKINE_K, SLUG_FT3_KG_M3, SQUARE_FOOT_M2,
    SQUARE_FOOT_PER_SECOND_M2_S,
};

/// Which units a command reads and writes.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default, clap::ValueEnum)]
pub enum UnitSystem {
    /// SI: m, m/s, K, Pa, kg/m3.
    #[default]
    Si,
    /// US customary: ft, ft/s (airspeeds in kt), degF (differences in degR), psf
    /// (altimetry in inHg), slug/ft3, lbf.
    Us,
}

/// The kinds of quantity the command line reads or writes.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Quantity {
    /// Altitudes, heights and other lengths.
    Length,
    /// Velocities and speeds (not airspeeds, which have their own `--unit`).
    Speed,
    /// Absolute temperature.
    Temperature,
    /// A temperature difference (an offset from the standard day).
    TemperatureDifference,
    /// Pressures in aerodynamics: static, dynamic and impact pressure.
    Pressure,
    /// Pressures in altimetry: barometer readings, QNH and pad pressures.
    AltimeterPressure,
    /// Mass density.
    Density,
    /// Dynamic viscosity.
    DynamicViscosity,
    /// Kinematic viscosity.
    KinematicViscosity,
    /// Thermal conductivity.
    ThermalConductivity,
    /// Acceleration (gravity).
    Acceleration,
    /// Particles per volume.
    NumberDensity,
    /// Per unit length (the unit Reynolds number).
    PerLength,
    /// Force (drag).
    Force,
    /// Area (reference area).
    Area,
    /// Time.
    Time,
    /// Frequency.
    Frequency,
    /// Molar mass (kg/kmol, numerically lb/lbmol in either system).
    MolarMass,
    /// A number without a unit.
    Dimensionless,
}

/// A unit: its spelling in column names, its symbol for people, and how it relates to SI.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Unit {
    /// As it ends a CSV or JSON column name (`m_s`, `degF`); empty for a pure number.
    pub suffix: &'static str,
    /// As a person reads it in a heading or an axis label (`m/s`, `degF`).
    pub symbol: &'static str,
    /// The value of one unit in SI.
    scale: f64,
    /// Fahrenheit's zero: the only unit that is not a plain multiple of its SI unit.
    fahrenheit: bool,
}

const fn unit(suffix: &'static str, symbol: &'static str, scale: f64) -> Unit {
    Unit { suffix, symbol, scale, fahrenheit: false }
}

impl Unit {
    /// `si` (in the SI unit) expressed in this unit.
    pub fn from_si(self, si: f64) -> f64 {
        if self.fahrenheit {
            kelvin_to_fahrenheit(si)
        } else {
            si / self.scale
        }
    }

    /// `value` (in this unit) in SI.
    pub fn to_si(self, value: f64) -> f64 {
        if self.fahrenheit {
            fahrenheit_to_kelvin(value)
        } else {
            value * self.scale
        }
    }

    /// `base` with this unit's suffix: the column name (`pressure` -> `pressure_Pa`).
    pub fn key(self, base: &str) -> String {
        if self.suffix.is_empty() {
            base.to_owned()
        } else {
            format!("{base}_{}", self.suffix)
        }
    }
}

impl UnitSystem {
    /// The unit of `quantity` in this system.
    pub fn unit(self, quantity: Quantity) -> Unit {
        use Quantity as Q;
        match (self, quantity) {
            (_, Q::Time) => unit("s", "s", 1.0),
            (_, Q::Frequency) => unit("Hz", "Hz", 1.0),
            (_, Q::MolarMass) => unit("kg_kmol", "kg/kmol", 1.0),
            (_, Q::Dimensionless) => unit("", "", 1.0),
            (UnitSystem::Si, Q::Length) => unit("m", "m", 1.0),
            (UnitSystem::Si, Q::Speed) => unit("m_s", "m/s", 1.0),
            (UnitSystem::Si, Q::Temperature) => unit("K", "K", 1.0),
            (UnitSystem::Si, Q::TemperatureDifference) => unit("K", "K", 1.0),
            (UnitSystem::Si, Q::Pressure | Q::AltimeterPressure) => unit("Pa", "Pa", 1.0),
            (UnitSystem::Si, Q::Density) => unit("kg_m3", "kg/m3", 1.0),
            (UnitSystem::Si, Q::DynamicViscosity) => unit("Pa_s", "Pa s", 1.0),
            (UnitSystem::Si, Q::KinematicViscosity) => unit("m2_s", "m2/s", 1.0),
            (UnitSystem::Si, Q::ThermalConductivity) => unit("W_m_K", "W/(m K)", 1.0),
            (UnitSystem::Si, Q::Acceleration) => unit("m_s2", "m/s2", 1.0),
            (UnitSystem::Si, Q::NumberDensity) => unit("m3", "1/m3", 1.0),
            (UnitSystem::Si, Q::PerLength) => unit("per_m", "1/m", 1.0),
            (UnitSystem::Si, Q::Force) => unit("N", "N", 1.0),
            (UnitSystem::Si, Q::Area) => unit("m2", "m2", 1.0),
            (UnitSystem::Us, Q::Length) => unit("ft", "ft", FOOT_M),
            (UnitSystem::Us, Q::Speed) => unit("ft_s", "ft/s", FOOT_PER_SECOND_M_S),
            (UnitSystem::Us, Q::Temperature) => Unit { fahrenheit: true, ..unit("degF", "degF", RANKINE_K) },
            (UnitSystem::Us, Q::TemperatureDifference) => unit("degR", "degF", RANKINE_K),
            (UnitSystem::Us, Q::Pressure) => unit("psf", "psf", PSF_PA),
            (UnitSystem::Us, Q::AltimeterPressure) => unit("inHg", "inHg", INHG_PA),
            (UnitSystem::Us, Q::Density) => unit("slug_ft3", "slug/ft3", SLUG_FT3_KG_M3),
            (UnitSystem::Us, Q::DynamicViscosity) => {
                unit("lbf_s_ft2", "lbf s/ft2", POUND_FORCE_SECOND_PER_SQUARE_FOOT_PA_S)
            }
            (UnitSystem::Us, Q::KinematicViscosity) => unit("ft2_s", "ft2/s", SQUARE_FOOT_PER_SECOND_M2_S),
            (UnitSystem::Us, Q::ThermalConductivity) => {
                unit("lbf_s_degR", "lbf/(s degR)", POUND_FORCE_PER_SECOND_RANKINE_W_M_K)
            }
            (UnitSystem::Us, Q::Acceleration) => unit("ft_s2", "ft/s2", FOOT_PER_SECOND_SQUARED_M_S2),
            (UnitSystem::Us, Q::NumberDensity) => unit("ft3", "1/ft3", 1.0 / CUBIC_FOOT_M3),
            (UnitSystem::Us, Q::PerLength) => unit("per_ft", "1/ft", 1.0 / FOOT_M),
            (UnitSystem::Us, Q::Force) => unit("lbf", "lbf", POUND_FORCE_N),
            (UnitSystem::Us, Q::Area) => unit("ft2", "ft2", SQUARE_FOOT_M2),
        }
    }

    /// `si` in this system's unit of `quantity`.
    pub fn from_si(self, quantity: Quantity, si: f64) -> f64 {
        self.unit(quantity).from_si(si)
    }

    /// `value`, in this system's unit of `quantity`, in SI.
    pub fn to_si(self, quantity: Quantity, value: f64) -> f64 {
        self.unit(quantity).to_si(value)
    }

    /// The symbol of `quantity`'s unit.
    pub fn symbol(self, quantity: Quantity) -> &'static str {
        self.unit(quantity).symbol
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const ALL: [Quantity; 19] = [
        Quantity::Length,
        Quantity::Speed,
        Quantity::Temperature,
        Quantity::TemperatureDifference,
        Quantity::Pressure,
        Quantity::AltimeterPressure,
        Quantity::Density,
        Quantity::DynamicViscosity,
        Quantity::KinematicViscosity,
        Quantity::ThermalConductivity,
        Quantity::Acceleration,
        Quantity::NumberDensity,
        Quantity::PerLength,
        Quantity::Force,
        Quantity::Area,
        Quantity::Time,
        Quantity::Frequency,
        Quantity::MolarMass,
        Quantity::Dimensionless,
    ];

    #[test]
    fn round_trips_through_us_units() {
        for quantity in ALL {
            // Fahrenheit's offset costs digits near 0 K; no air is that cold.
            let values: &[f64] = if quantity == Quantity::Temperature {
                &[1.0, 186.87, 288.15, 1000.0, 2000.0]
            } else {
                &[1.0e-9, 0.3, 1.0, 288.15, 101_325.0, 2.5e25]
            };
            for &si in values {
                let back = UnitSystem::Us.to_si(quantity, UnitSystem::Us.from_si(quantity, si));
                assert!((back / si - 1.0).abs() <= 1e-14, "{quantity:?} {si} -> {back}");
            }
        }
    }

    #[test]
    fn published_conversions() {
        let us = UnitSystem::Us;
        // Water freezes at 32 degF and boils at 212 degF (by definition of the scale).
        assert!((us.from_si(Quantity::Temperature, 273.15) - 32.0).abs() < 1e-12);
        assert!((us.from_si(Quantity::Temperature, 373.15) - 212.0).abs() < 1e-12);
        // Standard sea level: 2116.22 psf, 29.9213 inHg, 0.00237689 slug/ft3 (the 1976
        // standard's English-unit values; from memory of the printed table).
        assert!((us.from_si(Quantity::Pressure, 101_325.0) - 2116.22).abs() < 0.01);
        assert!((us.from_si(Quantity::AltimeterPressure, 101_325.0) - 29.9213).abs() < 1e-4);
        assert!((us.from_si(Quantity::Density, 1.225) - 0.00237689).abs() < 1e-7);
        assert_eq!(us.from_si(Quantity::Length, 0.3048), 1.0);
        assert_eq!(UnitSystem::Si.unit(Quantity::Pressure).key("pressure"), "pressure_Pa");
        assert_eq!(us.unit(Quantity::Dimensionless).key("mach"), "mach");
    }
}
