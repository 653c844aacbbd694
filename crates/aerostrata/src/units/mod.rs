//! Units of measure: every conversion a door of aerostrata uses, and the one parser of
//! "value + unit" text (`15C`, `1020hPa`, `35000 ft`) that every door reads input with.
//!
//! The core computes in SI (angles in degrees, as the trade states them); conversions
//! happen only at the edges, through the [`Unit`]s
//! here. Each factor is exact by definition (the international foot, yard and pound of
//! 1959, the standard acceleration of gravity) or carries its source (NIST Special
//! Publication 811, 2008 edition, appendix B.8). A temperature and a temperature
//! difference are different [`Dimension`]s: `15C` read as a temperature is 288.15 K, read
//! as a difference (an offset from the standard day) it is 15 K.

mod factors;
mod parse;
mod read;
mod table;

pub use factors::*;
pub use parse::{parse, shorten, Escaped, Quoted, Reading, UnitError, UnitList};
pub use read::{read, Part, Plausible, ReadError, Tidy};
pub use table::*;

/// What a unit measures. Two units convert into each other only within one dimension.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum Dimension {
    /// Altitudes, heights and other lengths.
    Length,
    /// Velocities and speeds.
    Speed,
    /// Absolute (thermodynamic) temperature.
    Temperature,
    /// A temperature difference, such as a hot day's offset from the standard.
    TemperatureDifference,
    /// Pressure.
    Pressure,
    /// Mass density.
    Density,
    /// Dynamic viscosity.
    DynamicViscosity,
    /// Kinematic viscosity.
    KinematicViscosity,
    /// Thermal conductivity.
    ThermalConductivity,
    /// Acceleration.
    Acceleration,
    /// Particles per volume.
    NumberDensity,
    /// Per unit length (the unit Reynolds number).
    PerLength,
    /// Force.
    Force,
    /// Area.
    Area,
    /// Time.
    Time,
    /// Frequency.
    Frequency,
    /// Molar mass.
    MolarMass,
    /// Plane angle.
    Angle,
    /// Pressure times angle: the q-alpha of a slender vehicle's bending loads.
    PressureAngle,
    /// Temperature gradient in altitude (a lapse rate).
    LapseRate,
    /// A fraction in per cent (relative humidity).
    Percent,
    /// A pure number.
    Dimensionless,
}

impl Dimension {
    /// Every dimension, in declaration order.
    pub const ALL: [Dimension; 22] = [
        Dimension::Length,
        Dimension::Speed,
        Dimension::Temperature,
        Dimension::TemperatureDifference,
        Dimension::Pressure,
        Dimension::Density,
        Dimension::DynamicViscosity,
        Dimension::KinematicViscosity,
        Dimension::ThermalConductivity,
        Dimension::Acceleration,
        Dimension::NumberDensity,
        Dimension::PerLength,
        Dimension::Force,
        Dimension::Area,
        Dimension::Time,
        Dimension::Frequency,
        Dimension::MolarMass,
        Dimension::Angle,
        Dimension::PressureAngle,
        Dimension::LapseRate,
        Dimension::Percent,
        Dimension::Dimensionless,
    ];

    /// The dimension in words, for messages ("a temperature difference").
    pub fn name(self) -> &'static str {
        match self {
            Dimension::Length => "length",
            Dimension::Speed => "speed",
            Dimension::Temperature => "temperature",
            Dimension::TemperatureDifference => "temperature difference",
            Dimension::Pressure => "pressure",
            Dimension::Density => "density",
            Dimension::DynamicViscosity => "dynamic viscosity",
            Dimension::KinematicViscosity => "kinematic viscosity",
            Dimension::ThermalConductivity => "thermal conductivity",
            Dimension::Acceleration => "acceleration",
            Dimension::NumberDensity => "number density",
            Dimension::PerLength => "reciprocal length",
            Dimension::Force => "force",
            Dimension::Area => "area",
            Dimension::Time => "time",
            Dimension::Frequency => "frequency",
            Dimension::MolarMass => "molar mass",
            Dimension::Angle => "angle",
            Dimension::PressureAngle => "pressure times angle",
            Dimension::LapseRate => "lapse rate",
            Dimension::Percent => "percentage",
            Dimension::Dimensionless => "pure number",
        }
    }

    /// The units of this dimension that [`parse`] knows, SI first.
    pub fn units(self) -> impl Iterator<Item = &'static Unit> {
        UNITS.iter().filter(move |u| u.dimension == self)
    }

    /// The SI unit of this dimension.
    pub fn si(self) -> &'static Unit {
        // Every dimension's SI unit is listed first among its units (a test checks it).
        self.units().next().unwrap_or(&ONE)
    }
}

/// How a unit relates to SI.
#[derive(Debug, Clone, Copy, PartialEq)]
enum Conversion {
    /// SI = value x factor.
    Factor(f64),
    /// Degrees Celsius: K = degC + 273.15.
    Celsius,
    /// Degrees Fahrenheit: K = (degF - 32) / 1.8 + 273.15.
    Fahrenheit,
}

/// A unit of measure: how people write it, how a column name ends with it, and how it
/// converts to SI.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Unit {
    symbol: &'static str,
    suffix: &'static str,
    dimension: Dimension,
    conversion: Conversion,
}

const fn unit(symbol: &'static str, suffix: &'static str, dimension: Dimension, factor: f64) -> Unit {
    Unit { symbol, suffix, dimension, conversion: Conversion::Factor(factor) }
}

impl Unit {
    /// The symbol as people read it in a heading or a message (`m/s`, `degF`, `kg/m3`);
    /// empty for a pure number.
    pub fn symbol(&self) -> &'static str {
        self.symbol
    }

    /// The unit as it ends a column name (`m_s`, `degF`, `kg_m3`); empty for a pure
    /// number.
    pub fn suffix(&self) -> &'static str {
        self.suffix
    }

    /// What the unit measures.
    pub fn dimension(&self) -> Dimension {
        self.dimension
    }

    /// Every spelling [`parse`] accepts for this unit (the symbol and suffix among them).
    pub fn spellings(&self) -> &'static [&'static str] {
        UNITS.iter().position(|u| u == self).and_then(|i| table::SPELLINGS.get(i)).copied().unwrap_or(&[])
    }

    /// `value`, in this unit, in SI.
    ///
    /// ```text
    /// factor units: SI = value x factor;  degC: K = value + 273.15;
    /// degF: K = (value - 32) / 1.8 + 273.15
    /// ```
    #[inline]
    pub fn to_si(&self, value: f64) -> f64 {
        match self.conversion {
            Conversion::Factor(factor) => value * factor,
            Conversion::Celsius => value + CELSIUS_ZERO_K,
            Conversion::Fahrenheit => fahrenheit_to_kelvin(value),
        }
    }

    /// `si`, in the SI unit of this unit's dimension, in this unit (the inverse of
    /// [`Unit::to_si`]; a division by the factor, so that exact factors give exact
    /// round trips where the numbers allow).
    #[inline]
    pub fn from_si(&self, si: f64) -> f64 {
        match self.conversion {
            Conversion::Factor(factor) => si / factor,
            Conversion::Celsius => si - CELSIUS_ZERO_K,
            Conversion::Fahrenheit => kelvin_to_fahrenheit(si),
        }
    }

    /// One of this unit in SI, for a unit that is a plain multiple of its SI unit; `None`
    /// for degrees Celsius and Fahrenheit (temperatures with an offset zero).
    pub fn factor(&self) -> Option<f64> {
        match self.conversion {
            Conversion::Factor(factor) => Some(factor),
            Conversion::Celsius | Conversion::Fahrenheit => None,
        }
    }

    /// `base` with this unit's suffix: the column name (`pressure` -> `pressure_Pa`).
    #[cfg(feature = "alloc")]
    pub fn key(&self, base: &str) -> alloc::string::String {
        if self.suffix.is_empty() {
            base.into()
        } else {
            alloc::format!("{base}_{}", self.suffix)
        }
    }

    /// The unit whose spelling is `text` among the units of `dimension`: an exact match
    /// first, then one that differs only in ASCII case when exactly one unit matches so.
    pub fn find(text: &str, dimension: Dimension) -> Option<&'static Unit> {
        let text = text.trim();
        if let Some(unit) = dimension.units().find(|u| u.spellings().contains(&text)) {
            return Some(unit);
        }
        let mut folded =
            dimension.units().filter(|u| u.spellings().iter().any(|s| s.eq_ignore_ascii_case(text)));
        let first = folded.next();
        if folded.next().is_some() {
            None
        } else {
            first
        }
    }

    /// The unit whose spelling is exactly `text` in any dimension (what a message needs to
    /// say "ft is a length, not a temperature").
    pub fn find_any(text: &str) -> Option<&'static Unit> {
        let text = text.trim();
        UNITS.iter().zip(table::SPELLINGS).find(|(_, s)| s.contains(&text)).map(|(u, _)| u)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The fixed points of the two scales (common practice, no source): water freezes at
    /// 32 degF = 273.15 K; the standard's sea level is 59 degF = 288.15 K.
    #[test]
    fn fahrenheit_round_values_stay_round() {
        for (f, k) in [(32.0, 273.15), (59.0, 288.15), (212.0, 373.15)] {
            assert_eq!(kelvin_to_fahrenheit(k), f, "{k} K");
            assert!((fahrenheit_to_kelvin(f) - k).abs() <= 1e-13 * k, "{f} degF");
        }
        assert!((kelvin_to_fahrenheit(0.0) + 459.67).abs() < 1e-12);
        // The tropopause's 216.65 K (-56.5 degC) is -69.7 degF to the last bits.
        assert!((kelvin_to_fahrenheit(216.65) + 69.7).abs() < 1e-13);
    }

    /// The factors against NIST SP 811 (2008), appendix B.8, which prints them to 7
    /// significant digits (an asterisk there marks the exact ones).
    #[test]
    fn unit_factors_match_nist_sp_811() {
        let close = |value: f64, printed: f64| (value / printed - 1.0).abs() < 1e-6;
        assert_eq!(SQUARE_FOOT_M2, 9.290_304e-2); // exact in SP 811
        assert!(close(CUBIC_FOOT_M3, 2.831_685e-2));
        assert_eq!(SQUARE_FOOT_PER_SECOND_M2_S, 9.290_304e-2); // exact in SP 811
        assert!(close(POUND_FORCE_SECOND_PER_SQUARE_FOOT_PA_S, 4.788_026e1));
        assert!(close(SLUG_FT3_KG_M3, 5.153_788e2));
        assert!(close(POUND_FT3_KG_M3, 1.601_846e1));
        assert!(close(PSF_PA, 4.788_026e1));
        assert!(close(PSI_PA, 6.894_757e3));
        assert!(close(MMHG_PA, 1.333_224e2));
        assert_eq!(INHG_PA, 3.386_389e3);
        assert_eq!(FOOT_PER_SECOND_M_S, 3.048e-1); // exact in SP 811
        assert_eq!(FOOT_PER_SECOND_SQUARED_M_S2, 3.048e-1); // exact in SP 811
        assert_eq!(MILE_PER_HOUR_M_S, 4.4704e-1); // exact in SP 811
        assert!(close(KNOT_M_S, 5.144_444e-1));
        assert!(close(KILOMETRE_PER_HOUR_M_S, 2.777_778e-1));
        assert_eq!(POUND_FORCE_N, POUND_KG * STANDARD_GRAVITY_M_S2);
        // lbf/(s degR) is not printed there: it is lbf (4.448222 N) over 5/9 K per second.
        assert!(close(POUND_FORCE_PER_SECOND_RANKINE_W_M_K, 4.448_222 * 1.8));
    }

    #[test]
    fn every_dimension_lists_its_si_unit_first() {
        for dimension in Dimension::ALL {
            let si = dimension.si();
            assert_eq!(si.dimension, dimension);
            assert_eq!(si.to_si(1.0), 1.0, "{dimension:?}: {}", si.symbol);
            assert_eq!(si.factor(), Some(1.0), "{dimension:?}");
        }
    }

    #[test]
    fn spellings_name_one_unit_within_a_dimension() {
        for unit in UNITS {
            assert!(unit.spellings().contains(&unit.symbol), "{}: its symbol", unit.symbol);
            assert!(
                unit.suffix.is_empty() || unit.spellings().contains(&unit.suffix),
                "{}: its suffix",
                unit.symbol
            );
            for spelling in unit.spellings() {
                let found = Unit::find(spelling, unit.dimension).unwrap();
                assert_eq!(found, unit, "{spelling:?}");
            }
        }
    }

    #[test]
    fn bare_numbers_take_the_default_unit_and_suffixes_win() {
        let t = parse("288.15", Dimension::Temperature, &KELVIN).unwrap();
        assert_eq!((t.si(), t.explicit), (288.15, false));
        for text in ["15C", "15 C", "15degC", "15 degC", " 15°C ", "288.15K", "288.15 kelvin", "518.67R"] {
            let t = parse(text, Dimension::Temperature, &KELVIN).unwrap();
            assert!((t.si() - 288.15).abs() < 1e-12, "{text}: {}", t.si());
            assert!(t.explicit);
        }
        // 15 + 273.15 and 288.15 are the same double: the Celsius conversion is exact here.
        assert_eq!(parse("15C", Dimension::Temperature, &KELVIN).unwrap().si(), 288.15);
        assert_eq!(parse("59F", Dimension::Temperature, &KELVIN).unwrap().si(), fahrenheit_to_kelvin(59.0));
        // A difference of 15 degC is 15 K; of 27 degF, 15 K.
        assert_eq!(parse("+15C", Dimension::TemperatureDifference, &KELVIN_DIFFERENCE).unwrap().si(), 15.0);
        assert!(
            (parse("+27F", Dimension::TemperatureDifference, &KELVIN_DIFFERENCE).unwrap().si() - 15.0).abs()
                < 1e-14
        );
        assert_eq!(parse("1020hPa", Dimension::Pressure, &PASCAL).unwrap().si(), 102_000.0);
        assert_eq!(parse("1020 mbar", Dimension::Pressure, &PASCAL).unwrap().si(), 102_000.0);
        assert_eq!(parse("101.3kPa", Dimension::Pressure, &PASCAL).unwrap().si(), 101_300.0);
        assert_eq!(parse("29.92inHg", Dimension::Pressure, &PASCAL).unwrap().si(), 29.92 * INHG_PA);
        assert_eq!(parse("35000ft", Dimension::Length, &METRE).unwrap().si(), 35_000.0 * FOOT_M);
        assert_eq!(parse("10km", Dimension::Length, &METRE).unwrap().si(), 10_000.0);
        assert_eq!(parse("250kt", Dimension::Speed, &METRE_PER_SECOND).unwrap().si(), 250.0 * KNOT_M_S);
        assert_eq!(parse("1e3 ft", Dimension::Length, &METRE).unwrap().si(), 1000.0 * FOOT_M);
        assert_eq!(parse("-5e-1", Dimension::Length, &FOOT).unwrap().si(), -0.5 * FOOT_M);
        // A case-folded spelling is accepted when it names one unit only.
        assert_eq!(parse("29.92INHG", Dimension::Pressure, &PASCAL).unwrap().unit, &INCH_OF_MERCURY);
        assert_eq!(parse("100 KT", Dimension::Speed, &METRE_PER_SECOND).unwrap().unit, &KNOT);
    }

    #[test]
    fn errors_name_the_problem_and_the_fix() {
        let message = |text: &str, d: Dimension| parse(text, d, d.si()).unwrap_err().to_string();
        assert_eq!(message("abc", Dimension::Length), "'abc' is not a number");
        assert_eq!(message("", Dimension::Length), "no value given");
        assert_eq!(message("1e999", Dimension::Length), "'1e999' is not a finite number");
        assert_eq!(message("nan", Dimension::Length), "'nan' is not a number");
        assert_eq!(message("inf", Dimension::Length), "'inf' is not a number");
        assert_eq!(
            message("15ft", Dimension::Temperature),
            "'ft' is a unit of length, not of temperature; write K, degC, degF or degR"
        );
        assert_eq!(
            message("15x", Dimension::Temperature),
            "unknown unit 'x' for a temperature; write K, degC, degF or degR"
        );
        assert!(message("1013,25", Dimension::Pressure).contains("write decimals with a point"));
        let long = "9".repeat(5) + &"z".repeat(100);
        assert!(message(&long, Dimension::Length).len() < 200, "echoed input is cut");
        // Control characters are echoed as escapes; other characters as typed.
        assert_eq!(
            message("1\u{7}\t", Dimension::Length),
            "unknown unit '\\u{7}' for a length; write m, km, ft, mi or nmi"
        );
        assert_eq!(message("x\tÅ", Dimension::Length), "'x\\tÅ' is not a number");
    }

    #[test]
    fn every_unit_round_trips() {
        for unit in UNITS {
            // Offset zeros cost digits near 0 K; no air is that cold.
            let values: &[f64] = if unit.factor().is_some() {
                &[1e-9, 0.3, 1.0, 216.65, 288.15, 101_325.0, 2.5e25]
            } else {
                &[100.0, 186.87, 216.65, 288.15, 1000.0, 2000.0]
            };
            for &si in values {
                let back = unit.to_si(unit.from_si(si));
                assert!((back / si - 1.0).abs() <= 4.0 * f64::EPSILON, "{} {si} -> {back}", unit.symbol);
            }
        }
    }
}
