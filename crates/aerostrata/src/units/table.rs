//! Every unit the doors read and write, by dimension with the SI unit first: symbol,
//! column-name suffix, factor to SI and the spellings the parser accepts.

use super::factors::*;
use super::{unit, Conversion, Dimension, Unit};

macro_rules! units {
    ($($(#[$doc:meta])* $name:ident = $value:expr, $spellings:expr;)*) => {
        $($(#[$doc])* pub const $name: Unit = $value;)*
        /// Every unit the parser knows, grouped by dimension with the SI unit first.
        pub static UNITS: &[Unit] = &[$($name),*];
        /// The spellings the parser accepts for each unit of [`UNITS`], in its order: kept
        /// apart from the units so that a program which converts but never parses (the
        /// WebAssembly module, firmware) links no spellings.
        pub(super) static SPELLINGS: &[&[&str]] = &[$($spellings),*];
    };
}

units! {
    /// Metre.
    METRE = unit("m", "m", Dimension::Length, 1.0), &["m", "metre", "metres", "meter", "meters"];
    /// Kilometre.
    KILOMETRE = unit("km", "km", Dimension::Length, 1000.0), &["km", "kilometre", "kilometres", "kilometer", "kilometers"];
    /// International foot.
    FOOT = unit("ft", "ft", Dimension::Length, FOOT_M), &["ft", "foot", "feet"];
    /// Statute mile.
    MILE = unit("mi", "mi", Dimension::Length, MILE_M), &["mi", "mile", "miles"];
    /// International nautical mile.
    NAUTICAL_MILE = unit("nmi", "nmi", Dimension::Length, NAUTICAL_MILE_M), &["nmi", "NM"];
    /// Metre per second.
    METRE_PER_SECOND = unit("m/s", "m_s", Dimension::Speed, 1.0), &["m/s", "m_s", "mps", "m s-1", "m s^-1"];
    /// Foot per second.
    FOOT_PER_SECOND = unit("ft/s", "ft_s", Dimension::Speed, FOOT_PER_SECOND_M_S), &["ft/s", "ft_s", "fps"];
    /// Knot.
    KNOT = unit("kt", "kt", Dimension::Speed, KNOT_M_S), &["kt", "kts", "kn", "knot", "knots"];
    /// Kilometre per hour.
    KILOMETRE_PER_HOUR = unit("km/h", "km_h", Dimension::Speed, KILOMETRE_PER_HOUR_M_S), &["km/h", "km_h", "kph", "kmh"];
    /// Mile per hour.
    MILE_PER_HOUR = unit("mph", "mph", Dimension::Speed, MILE_PER_HOUR_M_S), &["mph", "mi/h"];
    /// Kelvin.
    KELVIN = unit("K", "K", Dimension::Temperature, 1.0), &["K", "kelvin", "kelvins"];
    /// Degree Celsius (a temperature).
    DEGREE_CELSIUS = Unit {
        conversion: Conversion::Celsius,
        ..unit("degC", "degC", Dimension::Temperature, 1.0)
    }, &["degC", "C", "°C", "deg_C", "deg C", "celsius"];
    /// Degree Fahrenheit (a temperature).
    DEGREE_FAHRENHEIT = Unit {
        conversion: Conversion::Fahrenheit,
        ..unit("degF", "degF", Dimension::Temperature, 1.0)
    }, &["degF", "F", "°F", "deg_F", "deg F", "fahrenheit"];
    /// Degree Rankine (a temperature).
    DEGREE_RANKINE = unit("degR", "degR", Dimension::Temperature, RANKINE_K), &["degR", "R", "°R", "deg_R", "rankine"];
    /// Kelvin, as a temperature difference.
    KELVIN_DIFFERENCE = unit("K", "K", Dimension::TemperatureDifference, 1.0), &["K", "kelvin", "kelvins"];
    /// Degree Celsius as a temperature difference: the same size as a kelvin.
    CELSIUS_DIFFERENCE = unit("degC", "degC", Dimension::TemperatureDifference, 1.0), &["degC", "C", "°C", "deg_C", "deg C", "celsius"];
    /// Degree Fahrenheit as a temperature difference: 5/9 K.
    FAHRENHEIT_DIFFERENCE = unit("degF", "degF", Dimension::TemperatureDifference, RANKINE_K), &["degF", "F", "°F", "deg_F", "deg F", "fahrenheit"];
    /// Degree Rankine as a temperature difference: 5/9 K.
    RANKINE_DIFFERENCE = unit("degR", "degR", Dimension::TemperatureDifference, RANKINE_K), &["degR", "R", "°R", "deg_R", "rankine"];
    /// Pascal.
    PASCAL = unit("Pa", "Pa", Dimension::Pressure, 1.0), &["Pa", "pascal", "pascals"];
    /// Hectopascal.
    HECTOPASCAL = unit("hPa", "hPa", Dimension::Pressure, HPA_PA), &["hPa"];
    /// Millibar.
    MILLIBAR = unit("mbar", "mbar", Dimension::Pressure, MBAR_PA), &["mbar", "mb"];
    /// Kilopascal.
    KILOPASCAL = unit("kPa", "kPa", Dimension::Pressure, KPA_PA), &["kPa"];
    /// Pound-force per square foot.
    PSF = unit("psf", "psf", Dimension::Pressure, PSF_PA), &["psf", "lbf/ft2", "lbf_ft2", "lbf/ft^2", "lb/ft2"];
    /// Pound-force per square inch.
    PSI = unit("psi", "psi", Dimension::Pressure, PSI_PA), &["psi", "lbf/in2", "lbf_in2", "lbf/in^2", "lb/in2"];
    /// Conventional inch of mercury.
    INCH_OF_MERCURY = unit("inHg", "inHg", Dimension::Pressure, INHG_PA), &["inHg", "in_Hg", "in Hg", "\"Hg"];
    /// Conventional millimetre of mercury.
    MILLIMETRE_OF_MERCURY = unit("mmHg", "mmHg", Dimension::Pressure, MMHG_PA), &["mmHg", "mm_Hg", "mm Hg"];
    /// Kilogram per cubic metre.
    KILOGRAM_PER_CUBIC_METRE = unit("kg/m3", "kg_m3", Dimension::Density, 1.0), &["kg/m3", "kg_m3", "kg/m^3", "kg m-3", "kg m^-3"];
    /// Slug per cubic foot.
    SLUG_PER_CUBIC_FOOT = unit("slug/ft3", "slug_ft3", Dimension::Density, SLUG_FT3_KG_M3), &["slug/ft3", "slug_ft3", "slug/ft^3"];
    /// Pound (mass) per cubic foot.
    POUND_PER_CUBIC_FOOT = unit("lb/ft3", "lb_ft3", Dimension::Density, POUND_FT3_KG_M3), &["lb/ft3", "lb_ft3", "lbm/ft3", "lb/ft^3"];
    /// Pascal second.
    PASCAL_SECOND = unit("Pa s", "Pa_s", Dimension::DynamicViscosity, 1.0), &["Pa s", "Pa_s", "Pa.s", "Pa*s", "kg/(m s)"];
    /// Pound-force second per square foot.
    POUND_FORCE_SECOND_PER_SQUARE_FOOT = unit("lbf s/ft2", "lbf_s_ft2", Dimension::DynamicViscosity, POUND_FORCE_SECOND_PER_SQUARE_FOOT_PA_S), &["lbf s/ft2", "lbf_s_ft2", "slug/(ft s)"];
    /// Square metre per second.
    SQUARE_METRE_PER_SECOND = unit("m2/s", "m2_s", Dimension::KinematicViscosity, 1.0), &["m2/s", "m2_s", "m^2/s"];
    /// Square foot per second.
    SQUARE_FOOT_PER_SECOND = unit("ft2/s", "ft2_s", Dimension::KinematicViscosity, SQUARE_FOOT_PER_SECOND_M2_S), &["ft2/s", "ft2_s", "ft^2/s"];
    /// Watt per metre kelvin.
    WATT_PER_METRE_KELVIN = unit("W/(m K)", "W_m_K", Dimension::ThermalConductivity, 1.0), &["W/(m K)", "W_m_K", "W/m/K", "W/(m*K)"];
    /// Pound-force per second degree Rankine.
    POUND_FORCE_PER_SECOND_RANKINE = unit("lbf/(s degR)", "lbf_s_degR", Dimension::ThermalConductivity, POUND_FORCE_PER_SECOND_RANKINE_W_M_K), &["lbf/(s degR)", "lbf_s_degR"];
    /// Metre per second squared.
    METRE_PER_SECOND_SQUARED = unit("m/s2", "m_s2", Dimension::Acceleration, 1.0), &["m/s2", "m_s2", "m/s^2"];
    /// Foot per second squared.
    FOOT_PER_SECOND_SQUARED = unit("ft/s2", "ft_s2", Dimension::Acceleration, FOOT_PER_SECOND_SQUARED_M_S2), &["ft/s2", "ft_s2", "ft/s^2"];
    /// Standard gravity as a unit of acceleration.
    STANDARD_GRAVITY = unit("g", "g", Dimension::Acceleration, STANDARD_GRAVITY_M_S2), &["g", "gn", "g0"];
    /// Per cubic metre.
    PER_CUBIC_METRE = unit("1/m3", "m3", Dimension::NumberDensity, 1.0), &["1/m3", "m3", "m^-3", "per_m3"];
    /// Per cubic foot.
    PER_CUBIC_FOOT = unit("1/ft3", "ft3", Dimension::NumberDensity, 1.0 / CUBIC_FOOT_M3), &["1/ft3", "ft3", "ft^-3", "per_ft3"];
    /// Per metre.
    PER_METRE = unit("1/m", "per_m", Dimension::PerLength, 1.0), &["1/m", "per_m", "m^-1"];
    /// Per foot.
    PER_FOOT = unit("1/ft", "per_ft", Dimension::PerLength, 1.0 / FOOT_M), &["1/ft", "per_ft", "ft^-1"];
    /// Newton.
    NEWTON = unit("N", "N", Dimension::Force, 1.0), &["N", "newton", "newtons"];
    /// Kilonewton.
    KILONEWTON = unit("kN", "kN", Dimension::Force, 1000.0), &["kN"];
    /// Pound-force.
    POUND_FORCE = unit("lbf", "lbf", Dimension::Force, POUND_FORCE_N), &["lbf"];
    /// Square metre.
    SQUARE_METRE = unit("m2", "m2", Dimension::Area, 1.0), &["m2", "m^2", "sq m"];
    /// Square centimetre.
    SQUARE_CENTIMETRE = unit("cm2", "cm2", Dimension::Area, 1e-4), &["cm2", "cm^2"];
    /// Square foot.
    SQUARE_FOOT = unit("ft2", "ft2", Dimension::Area, SQUARE_FOOT_M2), &["ft2", "ft^2", "sq ft"];
    /// Square inch.
    SQUARE_INCH = unit("in2", "in2", Dimension::Area, INCH_M * INCH_M), &["in2", "in^2", "sq in"];
    /// Second.
    SECOND = unit("s", "s", Dimension::Time, 1.0), &["s", "sec", "second", "seconds"];
    /// Hertz.
    HERTZ = unit("Hz", "Hz", Dimension::Frequency, 1.0), &["Hz", "1/s", "per_s"];
    /// Kilogram per kilomole (numerically gram per mole, or pound per pound-mole).
    KILOGRAM_PER_KILOMOLE = unit("kg/kmol", "kg_kmol", Dimension::MolarMass, 1.0), &["kg/kmol", "kg_kmol", "g/mol"];
    /// Degree of angle: the angle's base unit (angles are computed in degrees).
    DEGREE = unit("deg", "deg", Dimension::Angle, 1.0), &["deg", "°", "degree", "degrees"];
    /// Radian.
    RADIAN = unit("rad", "rad", Dimension::Angle, RADIAN_DEG), &["rad", "radian", "radians"];
    /// Pascal degree (q-alpha).
    PASCAL_DEGREE = unit("Pa deg", "Pa_deg", Dimension::PressureAngle, 1.0), &["Pa deg", "Pa_deg", "Pa*deg", "Pa.deg"];
    /// Kilopascal degree (q-alpha).
    KILOPASCAL_DEGREE = unit("kPa deg", "kPa_deg", Dimension::PressureAngle, 1000.0), &["kPa deg", "kPa_deg", "kPa*deg", "kPa.deg"];
    /// Pound-force per square foot degree (q-alpha).
    PSF_DEGREE = unit("psf deg", "psf_deg", Dimension::PressureAngle, PSF_PA), &["psf deg", "psf_deg", "psf*deg", "psf.deg"];
    /// Kelvin per metre (a lapse rate, dT/dH).
    KELVIN_PER_METRE = unit("K/m", "K_m", Dimension::LapseRate, 1.0), &["K/m", "K_m"];
    /// Kelvin per kilometre.
    KELVIN_PER_KILOMETRE = unit("K/km", "K_km", Dimension::LapseRate, 1e-3), &["K/km", "K_km"];
    /// Degree Fahrenheit (interval) per thousand feet.
    FAHRENHEIT_PER_THOUSAND_FEET = unit("degF/kft", "degF_kft", Dimension::LapseRate, RANKINE_K / (1000.0 * FOOT_M)), &["degF/kft", "degF_kft", "degF/1000ft"];
    /// Per cent.
    PERCENT = unit("%", "percent", Dimension::Percent, 1.0), &["%", "percent", "pct"];
    /// A pure number.
    ONE = unit("", "", Dimension::Dimensionless, 1.0), &[""];
}
