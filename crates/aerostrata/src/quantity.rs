//! The catalogue of quantities: every value a door of aerostrata can show or read, named
//! once. For each quantity: a stable machine name, a short symbol, a label and a one-line
//! description, its SI unit and its US customary unit (with the exact conversion, in
//! [`crate::units`]), whether it can be undefined, and how it is rounded for people.
//!
//! The CLI's columns and `--units us`, the WebAssembly module's list, the C header's
//! quantity ids, the spreadsheet functions, the firmware harness and the reference-vector
//! files all read their names and units from here; [`State::get`](crate::State::get),
//! [`FlightPoint::get`](crate::FlightPoint::get) and
//! [`Airspeeds::get`](crate::airspeed::Airspeeds::get) give the values. The ids are part
//! of the C ABI: an id is never reused or renumbered, new quantities take new ids.

use crate::units::{self, Unit};

/// Which result of the core carries a quantity.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum Group {
    /// The state of the atmosphere at an altitude ([`crate::State`]).
    State,
    /// The number densities of the 1976 standard's species above 86 km.
    Species,
    /// One sample of a flight scan ([`crate::FlightPoint`]); it also carries the state's
    /// density, pressure, temperature and speed of sound.
    Flight,
    /// Airspeeds and the pressures behind them ([`crate::Airspeeds`]).
    Airspeed,
    /// Altimetry: the altitudes a barometer gives, and the pressures it reads.
    Altimetry,
    /// A parameter a person gives rather than a result (a temperature offset, a humidity,
    /// a vehicle's size, the direction of a flight's velocity).
    Parameter,
    /// Winds aloft: a sounding's or a wind profile's, and a flight sample's.
    Wind,
}

/// How a value is rounded for people (tables, labels); machine formats (CSV, JSON) always
/// carry every digit.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Rounding {
    /// A fixed number of decimals.
    Decimals(u8),
    /// Six significant digits as `1.22500E+00`, the way printed tables show them.
    Scientific,
    /// Six significant digits, plain where that is short.
    Significant,
}

/// What the catalogue says of one quantity.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Info {
    /// The stable id (the C ABI's `AEROSTRATA_QUANTITY_*` value).
    pub id: u32,
    /// The machine name, snake_case, without a unit (`speed_of_sound`): CLI and CSV
    /// columns append the unit (`speed_of_sound_m_s`), the JS module camel-cases that
    /// (`speedOfSoundMS`), C names the id `AEROSTRATA_QUANTITY_SPEED_OF_SOUND`.
    pub name: &'static str,
    /// The short symbol of tables and axes (`a`).
    pub symbol: &'static str,
    /// A label for people, lower case but for proper names (`speed of sound`, `Mach
    /// number`); a heading capitalises its first letter.
    pub label: &'static str,
    /// One line of what it is.
    pub description: &'static str,
    /// Its SI unit: what the core computes in.
    pub si: &'static Unit,
    /// Its US customary unit.
    pub us: &'static Unit,
    /// Whether it can be undefined: the continuum properties in the free-molecular air
    /// above 86 km, a drag without a vehicle.
    pub may_be_undefined: bool,
    /// Which result carries it.
    pub group: Group,
    /// Rounding for people.
    pub rounding: Rounding,
    /// Shown in compact tables (the rest appear in full output such as CSV).
    pub primary: bool,
}

macro_rules! catalogue {
    ($(
        $variant:ident = $id:literal, $group:ident, $name:literal, $symbol:literal, $label:literal,
        $description:literal, $si:ident, $us:ident, $undefined:literal, $rounding:expr, $primary:literal;
    )*) => {
        /// A quantity of the catalogue; [`Quantity::info`] says what it is. The `u32`
        /// value is its stable id.
        #[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
        #[repr(u32)]
        #[non_exhaustive]
        pub enum Quantity {
            $(
                #[doc = concat!("The ", $label, " ", $symbol, ": ", $description, ".")]
                $variant = $id,
            )*
        }

        // The catalogue, in id order (ids run from 0 without gaps), one array per field:
        // a program that asks only for names links only the names (the size-budgeted
        // WebAssembly module and firmware need not carry every description).
        static NAMES: &[&str] = &[$($name),*];
        static SYMBOLS: &[&str] = &[$($symbol),*];
        static LABELS: &[&str] = &[$($label),*];
        static DESCRIPTIONS: &[&str] = &[$($description),*];
        static SI: &[&Unit] = &[$(&units::$si),*];
        static US: &[&Unit] = &[$(&units::$us),*];
        static TRAITS: &[(bool, Group, Rounding, bool)] = &[$(($undefined, Group::$group, $rounding, $primary)),*];

        impl Quantity {
            /// Every quantity, in id order.
            pub const ALL: &'static [Quantity] = &[$(Quantity::$variant),*];
        }
    };
}

use Rounding::{Decimals, Scientific, Significant};

catalogue! {
    // The state, in the order of `State::fields` (ids 0 to 19).
    GeometricAltitude = 0, State, "geometric_altitude", "Z", "geometric altitude",
        "height above mean sea level", METRE, FOOT, false, Decimals(1), true;
    GeopotentialAltitude = 1, State, "geopotential_altitude", "H", "geopotential altitude",
        "altitude in geopotential metres (equal potential energy per unit mass)", METRE, FOOT, false, Decimals(1), true;
    Temperature = 2, State, "temperature", "T", "temperature",
        "kinetic temperature of the air", KELVIN, DEGREE_FAHRENHEIT, false, Decimals(3), true;
    MolecularTemperature = 3, State, "molecular_temperature", "TM", "molecular-scale temperature",
        "kinetic temperature times the sea-level over the local mean molar mass", KELVIN, DEGREE_FAHRENHEIT, false, Decimals(3), false;
    Pressure = 4, State, "pressure", "p", "pressure",
        "static pressure of the air", PASCAL, PSF, false, Scientific, true;
    Density = 5, State, "density", "rho", "density",
        "mass density of the air", KILOGRAM_PER_CUBIC_METRE, SLUG_PER_CUBIC_FOOT, false, Scientific, true;
    SpeedOfSound = 6, State, "speed_of_sound", "a", "speed of sound",
        "speed of small pressure waves, sqrt(gamma R T / M); undefined above 86 km", METRE_PER_SECOND, FOOT_PER_SECOND, true, Decimals(4), true;
    DynamicViscosity = 7, State, "dynamic_viscosity", "mu", "dynamic viscosity",
        "Sutherland's law; undefined above 86 km", PASCAL_SECOND, POUND_FORCE_SECOND_PER_SQUARE_FOOT, true, Scientific, true;
    KinematicViscosity = 8, State, "kinematic_viscosity", "nu", "kinematic viscosity",
        "dynamic viscosity over density; undefined above 86 km", SQUARE_METRE_PER_SECOND, SQUARE_FOOT_PER_SECOND, true, Scientific, true;
    ThermalConductivity = 9, State, "thermal_conductivity", "k", "thermal conductivity",
        "the 1976 standard's formula; undefined above 86 km", WATT_PER_METRE_KELVIN, POUND_FORCE_PER_SECOND_RANKINE, true, Scientific, true;
    Gravity = 10, State, "gravity", "g", "acceleration of gravity",
        "the inverse-square law of the 1976 standard", METRE_PER_SECOND_SQUARED, FOOT_PER_SECOND_SQUARED, false, Decimals(4), true;
    PressureScaleHeight = 11, State, "pressure_scale_height", "Hp", "pressure scale height",
        "R* T / (M g): the height over which pressure falls by e", METRE, FOOT, false, Decimals(1), false;
    NumberDensity = 12, State, "number_density", "n", "number density",
        "particles per volume", PER_CUBIC_METRE, PER_CUBIC_FOOT, false, Scientific, false;
    MeanParticleSpeed = 13, State, "mean_particle_speed", "V", "mean particle speed",
        "mean speed of the air's molecules, sqrt(8 R* T / (pi M))", METRE_PER_SECOND, FOOT_PER_SECOND, false, Decimals(2), false;
    MeanFreePath = 14, State, "mean_free_path", "mfp", "mean free path",
        "mean distance a molecule travels between collisions", METRE, FOOT, false, Scientific, true;
    CollisionFrequency = 15, State, "collision_frequency", "nu_c", "collision frequency",
        "mean particle speed over mean free path", HERTZ, HERTZ, false, Scientific, false;
    MeanMolarMass = 16, State, "mean_molar_mass", "M", "mean molar mass",
        "mean molecular weight of the air", KILOGRAM_PER_KILOMOLE, KILOGRAM_PER_KILOMOLE, false, Decimals(4), false;
    TemperatureRatio = 17, State, "temperature_ratio", "theta", "temperature ratio",
        "temperature over the standard's sea-level 288.15 K", ONE, ONE, false, Scientific, false;
    PressureRatio = 18, State, "pressure_ratio", "delta", "pressure ratio",
        "pressure over the standard's sea-level 101 325 Pa", ONE, ONE, false, Scientific, false;
    DensityRatio = 19, State, "density_ratio", "sigma", "density ratio",
        "density over the standard's sea-level density", ONE, ONE, false, Scientific, false;
    // The 1976 standard's species, 86 to 1000 km (ids 20 to 25).
    NitrogenNumberDensity = 20, Species, "n_N2", "N2", "N2 number density",
        "molecules of nitrogen per volume, above 86 km", PER_CUBIC_METRE, PER_CUBIC_FOOT, true, Scientific, true;
    AtomicOxygenNumberDensity = 21, Species, "n_O", "O", "O number density",
        "atoms of oxygen per volume, above 86 km", PER_CUBIC_METRE, PER_CUBIC_FOOT, true, Scientific, true;
    OxygenNumberDensity = 22, Species, "n_O2", "O2", "O2 number density",
        "molecules of oxygen per volume, above 86 km", PER_CUBIC_METRE, PER_CUBIC_FOOT, true, Scientific, true;
    ArgonNumberDensity = 23, Species, "n_Ar", "Ar", "Ar number density",
        "atoms of argon per volume, above 86 km", PER_CUBIC_METRE, PER_CUBIC_FOOT, true, Scientific, true;
    HeliumNumberDensity = 24, Species, "n_He", "He", "He number density",
        "atoms of helium per volume, above 86 km", PER_CUBIC_METRE, PER_CUBIC_FOOT, true, Scientific, true;
    AtomicHydrogenNumberDensity = 25, Species, "n_H", "H", "H number density",
        "atoms of hydrogen per volume, above 86 km (below 150 km a continuation)", PER_CUBIC_METRE, PER_CUBIC_FOOT, true, Scientific, true;
    // A flight sample (ids 26 to 34); it also carries temperature, pressure, density and
    // speed of sound.
    Time = 26, Flight, "time", "t", "time",
        "time of a flight sample", SECOND, SECOND, false, Decimals(3), true;
    Altitude = 27, Flight, "altitude", "Z", "altitude",
        "geometric altitude of a flight sample", METRE, FOOT, false, Decimals(1), true;
    Velocity = 28, Flight, "velocity", "V", "velocity",
        "speed of a flight sample relative to the air", METRE_PER_SECOND, FOOT_PER_SECOND, false, Decimals(2), true;
    Mach = 29, Flight, "mach", "M", "Mach number",
        "speed over the speed of sound; undefined above 86 km", ONE, ONE, true, Decimals(4), true;
    DynamicPressure = 30, Flight, "dynamic_pressure", "q", "dynamic pressure",
        "rho V^2 / 2", PASCAL, PSF, false, Significant, true;
    UnitReynoldsNumber = 31, Flight, "reynolds", "Re/l", "unit Reynolds number",
        "rho V / mu, per unit length; undefined above 86 km", PER_METRE, PER_FOOT, true, Scientific, true;
    ReynoldsNumber = 32, Flight, "reynolds_number", "Re", "Reynolds number",
        "rho V L / mu for the vehicle's reference length; needs a length", ONE, ONE, true, Scientific, true;
    DragCoefficient = 33, Flight, "drag_coefficient", "Cd", "drag coefficient",
        "the vehicle's drag coefficient at the sample's Mach number; needs a vehicle", ONE, ONE, true, Decimals(4), true;
    Drag = 34, Flight, "drag", "D", "drag",
        "q Cd A; needs a vehicle", NEWTON, POUND_FORCE, true, Significant, true;
    // Airspeeds (ids 35 to 38).
    CalibratedAirspeed = 35, Airspeed, "calibrated_airspeed", "CAS", "calibrated airspeed",
        "the airspeed a standard sea-level pitot-static instrument shows", METRE_PER_SECOND, KNOT, false, Significant, true;
    EquivalentAirspeed = 36, Airspeed, "equivalent_airspeed", "EAS", "equivalent airspeed",
        "true airspeed times the square root of the density ratio", METRE_PER_SECOND, KNOT, false, Significant, true;
    TrueAirspeed = 37, Airspeed, "true_airspeed", "TAS", "true airspeed",
        "speed relative to the air", METRE_PER_SECOND, KNOT, false, Significant, true;
    ImpactPressure = 38, Airspeed, "impact_pressure", "qc", "impact pressure",
        "pitot minus static pressure", PASCAL, PSF, false, Significant, true;
    // Altimetry (ids 39 to 45).
    StaticPressure = 39, Altimetry, "static_pressure", "p", "static pressure",
        "pressure read by a barometer or a static port", PASCAL, INCH_OF_MERCURY, false, Significant, true;
    AltimeterSetting = 40, Altimetry, "altimeter_setting", "QNH", "altimeter setting",
        "the QNH an altimeter is set to: the sea-level pressure that makes it read the field's elevation", PASCAL, INCH_OF_MERCURY, false, Significant, true;
    PressureAltitude = 41, Altimetry, "pressure_altitude", "Hp", "pressure altitude",
        "geopotential altitude of the static pressure in the 1976 standard", METRE, FOOT, false, Decimals(1), true;
    PressureAltitudeGeometric = 42, Altimetry, "pressure_altitude_geometric", "Zp", "pressure altitude, geometric",
        "the pressure altitude as a geometric altitude", METRE, FOOT, false, Decimals(1), true;
    DensityAltitude = 43, Altimetry, "density_altitude", "Hd", "density altitude",
        "geopotential altitude of the density in the 1976 standard", METRE, FOOT, false, Decimals(1), true;
    QnhAltitude = 44, Altimetry, "qnh_altitude", "QNH", "QNH altitude",
        "the altitude an altimeter set to the QNH reads", METRE, FOOT, false, Decimals(1), true;
    HeightAbovePad = 45, Altimetry, "height_above_pad", "h pad", "height above the pad",
        "barometric height above the pad's pressure at launch", METRE, FOOT, false, Decimals(1), true;
    // Parameters a person gives (ids 46 to 50).
    TemperatureOffset = 46, Parameter, "temperature_offset", "dT", "temperature offset",
        "a hot (+) or cold (-) day's shift from the standard's temperature", KELVIN_DIFFERENCE, FAHRENHEIT_DIFFERENCE, false, Decimals(2), true;
    DewPoint = 47, Parameter, "dew_point", "Td", "dew point",
        "temperature at which the air's water vapour would saturate", KELVIN, DEGREE_FAHRENHEIT, false, Decimals(2), true;
    RelativeHumidity = 48, Parameter, "relative_humidity", "RH", "relative humidity",
        "vapour pressure over the saturation vapour pressure", PERCENT, PERCENT, false, Decimals(1), true;
    ReferenceArea = 49, Parameter, "reference_area", "A", "reference area",
        "the area a drag coefficient is referred to", SQUARE_METRE, SQUARE_FOOT, false, Significant, true;
    ReferenceLength = 50, Parameter, "reference_length", "L", "reference length",
        "the length a Reynolds number is referred to", METRE, FOOT, false, Significant, true;
    // Winds aloft (ids 51 to 54): a sounding's or a wind file's columns, and a flight
    // sample's wind.
    WindSpeed = 51, Wind, "wind_speed", "W", "wind speed",
        "horizontal speed of the wind", METRE_PER_SECOND, KNOT, false, Decimals(2), true;
    WindDirection = 52, Wind, "wind_direction", "W dir", "wind direction",
        "direction the wind blows from, clockwise from true north (the meteorological convention)", DEGREE, DEGREE, false, Decimals(1), true;
    WindEast = 53, Wind, "wind_east", "W east", "eastward wind",
        "east component of the wind's velocity (positive when it blows toward the east)", METRE_PER_SECOND, KNOT, false, Decimals(2), true;
    WindNorth = 54, Wind, "wind_north", "W north", "northward wind",
        "north component of the wind's velocity (positive when it blows toward the north)", METRE_PER_SECOND, KNOT, false, Decimals(2), true;
    // A flight sample with its velocity's direction (ids 55 to 62).
    VelocityEast = 55, Flight, "velocity_east", "V east", "eastward velocity",
        "east component of the ground-relative velocity", METRE_PER_SECOND, FOOT_PER_SECOND, true, Decimals(2), false;
    VelocityNorth = 56, Flight, "velocity_north", "V north", "northward velocity",
        "north component of the ground-relative velocity", METRE_PER_SECOND, FOOT_PER_SECOND, true, Decimals(2), false;
    VelocityUp = 57, Flight, "velocity_up", "V up", "upward velocity",
        "vertical component of the ground-relative velocity", METRE_PER_SECOND, FOOT_PER_SECOND, true, Decimals(2), false;
    Airspeed = 58, Flight, "airspeed", "V air", "airspeed",
        "speed relative to the air: the ground-relative velocity less the wind; q and Mach are computed from it", METRE_PER_SECOND, FOOT_PER_SECOND, false, Decimals(2), true;
    AngleOfAttack = 59, Flight, "alpha", "alpha", "total angle of attack",
        "angle between the vehicle's axis and the air-relative velocity; needs the velocity's direction", DEGREE, DEGREE, true, Decimals(3), true;
    QAlpha = 60, Flight, "q_alpha", "q alpha", "q-alpha",
        "dynamic pressure times the total angle of attack; needs the velocity's direction", PASCAL_DEGREE, PSF_DEGREE, true, Significant, true;
    TotalTemperature = 61, Flight, "total_temperature", "T0", "total temperature",
        "temperature of the air brought to rest adiabatically, T (1 + (gamma - 1) M^2 / 2); undefined above 86 km", KELVIN, DEGREE_FAHRENHEIT, true, Decimals(2), false;
    RecoveryTemperature = 62, Flight, "recovery_temperature", "Tr", "recovery temperature",
        "adiabatic-wall temperature, T (1 + r (gamma - 1) M^2 / 2) with r = Pr^(1/2) laminar or Pr^(1/3) turbulent; undefined above 86 km", KELVIN, DEGREE_FAHRENHEIT, true, Decimals(2), false;
    // The direction of a flight sample's velocity and of the vehicle's axis, as a flight
    // file may give them (ids 63 to 66).
    FlightPathAngle = 63, Parameter, "flight_path_angle", "gamma", "flight-path angle",
        "angle of the ground-relative velocity above the horizontal", DEGREE, DEGREE, false, Decimals(3), true;
    Heading = 64, Parameter, "heading", "psi", "heading",
        "direction of the ground-relative velocity's horizontal part, clockwise from true north", DEGREE, DEGREE, false, Decimals(3), true;
    AxisElevation = 65, Parameter, "axis_elevation", "theta", "axis elevation",
        "angle of the vehicle's axis above the horizontal", DEGREE, DEGREE, false, Decimals(3), true;
    AxisAzimuth = 66, Parameter, "axis_azimuth", "axis az", "axis azimuth",
        "direction of the vehicle's axis's horizontal part, clockwise from true north", DEGREE, DEGREE, false, Decimals(3), true;
}

impl Quantity {
    /// What the catalogue says of this quantity.
    pub fn info(self) -> Info {
        // The arrays are in id order from 0 (a test checks it), so the id is the index.
        let i = self as usize;
        let (may_be_undefined, group, rounding, primary) = TRAITS[i];
        Info {
            id: self as u32,
            name: NAMES[i],
            symbol: SYMBOLS[i],
            label: LABELS[i],
            description: DESCRIPTIONS[i],
            si: SI[i],
            us: US[i],
            may_be_undefined,
            group,
            rounding,
            primary,
        }
    }

    /// The stable id.
    pub fn id(self) -> u32 {
        self as u32
    }

    /// The quantity with id `id`, if there is one.
    pub fn from_id(id: u32) -> Option<Quantity> {
        Quantity::ALL.get(usize::try_from(id).ok()?).copied()
    }

    /// The quantity whose machine name is `name` (exactly; names are snake_case ASCII).
    pub fn from_name(name: &str) -> Option<Quantity> {
        Quantity::ALL.iter().copied().find(|q| q.info().name == name)
    }

    /// The machine name.
    pub fn name(self) -> &'static str {
        NAMES[self as usize]
    }

    /// The label for people (`speed of sound`).
    pub fn label(self) -> &'static str {
        LABELS[self as usize]
    }

    /// The SI unit.
    pub fn si(self) -> &'static Unit {
        SI[self as usize]
    }

    /// The US customary unit.
    pub fn us(self) -> &'static Unit {
        US[self as usize]
    }

    /// The band a value of this quantity typed by a person can plausibly have, where the
    /// trade knows one (temperatures, temperature offsets, sea-level pressures): what
    /// [`units::read`] checks a typed value against. `None` where any value the model
    /// accepts may be meant (an altitude, a speed, a size).
    pub fn plausible(self) -> Option<units::Plausible> {
        use units::Plausible as P;
        match self {
            Quantity::Temperature | Quantity::MolecularTemperature => Some(P::AIR_TEMPERATURE),
            Quantity::DewPoint => Some(P::DEW_POINT),
            Quantity::TemperatureOffset => Some(P::TEMPERATURE_OFFSET),
            Quantity::AltimeterSetting => Some(P::SEA_LEVEL_PRESSURE),
            _ => None,
        }
    }

    /// The quantities a result carries, in id order.
    pub fn of_group(group: Group) -> impl Iterator<Item = Quantity> {
        Quantity::ALL.iter().copied().filter(move |q| TRAITS[*q as usize].1 == group)
    }
}

/// A column heading read by [`Quantity::from_column`]: the quantity, and the unit the
/// heading names (`None` when it names none, so that the reader's default applies).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Column {
    /// The quantity.
    pub quantity: Quantity,
    /// The unit spelled in the heading, if any.
    pub unit: Option<&'static Unit>,
}

/// Why a column heading is not a quantity of the catalogue.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum ColumnError<'a> {
    /// No quantity has that name.
    Unknown,
    /// The name is a quantity's, the unit is not one of its dimension's.
    Unit {
        /// The quantity the name names.
        quantity: Quantity,
        /// The unit as written.
        unit: &'a str,
    },
}

impl core::fmt::Display for ColumnError<'_> {
    fn fmt(&self, f: &mut core::fmt::Formatter<'_>) -> core::fmt::Result {
        match *self {
            ColumnError::Unknown => f.write_str("no quantity has that name"),
            ColumnError::Unit { quantity, unit } => {
                let dimension = quantity.si().dimension();
                write!(
                    f,
                    "unknown unit {} for the {}; write {}",
                    units::Quoted(unit),
                    quantity.info().label,
                    units::UnitList(dimension)
                )
            }
        }
    }
}

/// `a` and `b` equal once ASCII case is folded and spaces and hyphens read as `_`.
fn same_name(a: &str, b: &str) -> bool {
    let fold = |c: u8| match c {
        b' ' | b'-' => b'_',
        c => c.to_ascii_lowercase(),
    };
    a.len() == b.len() && a.bytes().zip(b.bytes()).all(|(x, y)| fold(x) == fold(y))
}

impl Quantity {
    /// Reads a column heading of a table (a sounding, a flight file, CSV input): the
    /// quantity's machine name with or without a unit, in any of the spellings people
    /// write: `altitude_ft`, `altitude (ft)`, `Altitude [m]`, `temperature (degC)`,
    /// `wind speed [kt]`, `pressure_hPa`. Case, spaces and hyphens in the name do not
    /// matter; the unit is read by [`Unit::find`] among the units of the quantity's
    /// dimension.
    ///
    /// ```
    /// use aerostrata::Quantity;
    /// use aerostrata::units::{FOOT, DEGREE_CELSIUS};
    /// let c = Quantity::from_column("Altitude (ft)").unwrap();
    /// assert_eq!((c.quantity, c.unit), (Quantity::Altitude, Some(&FOOT)));
    /// let c = Quantity::from_column("temperature_degC").unwrap();
    /// assert_eq!((c.quantity, c.unit), (Quantity::Temperature, Some(&DEGREE_CELSIUS)));
    /// assert_eq!(Quantity::from_column("time").unwrap().unit, None);
    /// ```
    ///
    /// # Errors
    /// [`ColumnError::Unknown`] when no quantity has the name; [`ColumnError::Unit`] when
    /// one has, but the unit is not one of its dimension's.
    pub fn from_column(heading: &str) -> Result<Column, ColumnError<'_>> {
        let heading = heading.trim();
        // `name (unit)` or `name [unit]`.
        for (open, close) in [('(', ')'), ('[', ']')] {
            if let Some(inner) = heading.strip_suffix(close) {
                // Slices through `get`: no panic path is linked in (the wasm module's size).
                let split = inner.rfind(open).and_then(|at| Some((inner.get(..at)?, inner.get(at + 1..)?)));
                if let Some((name, unit)) = split {
                    let (name, unit) = (name.trim(), unit.trim());
                    let quantity = Quantity::ALL
                        .iter()
                        .copied()
                        .find(|q| same_name(q.name(), name))
                        .ok_or(ColumnError::Unknown)?;
                    return match Unit::find(unit, quantity.si().dimension()) {
                        Some(unit) => Ok(Column { quantity, unit: Some(unit) }),
                        None => Err(ColumnError::Unit { quantity, unit }),
                    };
                }
            }
        }
        // `name` alone, or `name_unit`: the longest name that fits wins, so that
        // `pressure_altitude_ft` is a pressure altitude, not a pressure in "altitude_ft".
        let mut best: Option<(Quantity, &str)> = None;
        for q in Quantity::ALL.iter().copied() {
            let name = q.name();
            if heading.len() == name.len() && same_name(name, heading) {
                return Ok(Column { quantity: q, unit: None });
            }
            let fits = heading
                .get(..name.len())
                .filter(|start| same_name(name, start))
                .and_then(|_| heading.get(name.len() + 1..))
                .filter(|rest| {
                    !rest.is_empty() && matches!(heading.as_bytes().get(name.len()), Some(b'_' | b' '))
                });
            if let Some(rest) = fits {
                if best.is_none_or(|(b, _)| b.name().len() < name.len()) {
                    best = Some((q, rest));
                }
            }
        }
        let (quantity, unit) = best.ok_or(ColumnError::Unknown)?;
        match Unit::find(unit, quantity.si().dimension()) {
            Some(unit) => Ok(Column { quantity, unit: Some(unit) }),
            None => Err(ColumnError::Unit { quantity, unit }),
        }
    }
}

impl core::error::Error for ColumnError<'_> {}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ids_run_from_zero_in_order_and_names_are_unique() {
        for array in
            [NAMES.len(), SYMBOLS.len(), LABELS.len(), DESCRIPTIONS.len(), SI.len(), US.len(), TRAITS.len()]
        {
            assert_eq!(array, Quantity::ALL.len());
        }
        for (index, quantity) in Quantity::ALL.iter().enumerate() {
            let info = quantity.info();
            assert_eq!(info.id as usize, index, "{}", info.name);
            assert_eq!(quantity.id(), info.id, "{}", info.name);
            assert_eq!(Quantity::from_id(info.id), Some(*quantity));
            assert_eq!(Quantity::from_name(info.name), Some(*quantity));
            assert!(
                info.name.bytes().all(|b| b.is_ascii_alphanumeric() || b == b'_'),
                "{}: machine names are snake_case ASCII",
                info.name
            );
            assert_eq!(
                info.si.dimension(),
                info.us.dimension(),
                "{}: SI and US units measure the same",
                info.name
            );
            assert_eq!(info.si, info.si.dimension().si(), "{}: the SI unit is its dimension's", info.name);
            assert!(!info.description.is_empty() && !info.label.is_empty() && !info.symbol.is_empty());
        }
        for (i, a) in NAMES.iter().enumerate() {
            assert!(!NAMES[i + 1..].contains(a), "{a} twice");
        }
        assert_eq!(Quantity::from_id(Quantity::ALL.len() as u32), None);
        assert_eq!(Quantity::from_name("Temperature"), None);
    }

    #[test]
    fn the_state_group_is_the_state_in_field_order() {
        let state: [Quantity; 20] = core::array::from_fn(|i| Quantity::ALL[i]);
        assert!(state.iter().all(|q| q.info().group == Group::State));
        assert_eq!(Quantity::of_group(Group::State).count(), 20);
    }

    #[test]
    fn column_headings_in_every_spelling() {
        use crate::units::*;
        fn read(h: &str) -> Result<(Quantity, Option<&'static str>), ColumnError<'_>> {
            Quantity::from_column(h).map(|c| (c.quantity, c.unit.map(|u| u.symbol())))
        }
        assert_eq!(read("altitude (ft)"), Ok((Quantity::Altitude, Some("ft"))));
        assert_eq!(read("altitude_ft"), Ok((Quantity::Altitude, Some("ft"))));
        assert_eq!(read("Altitude [m]"), Ok((Quantity::Altitude, Some("m"))));
        assert_eq!(read("temperature (degC)"), Ok((Quantity::Temperature, Some("degC"))));
        assert_eq!(read("temperature_K"), Ok((Quantity::Temperature, Some("K"))));
        assert_eq!(read("pressure_hPa"), Ok((Quantity::Pressure, Some("hPa"))));
        assert_eq!(read("pressure_altitude_ft"), Ok((Quantity::PressureAltitude, Some("ft"))));
        assert_eq!(read("pressure_ratio"), Ok((Quantity::PressureRatio, None)));
        assert_eq!(read("Dew Point [degF]"), Ok((Quantity::DewPoint, Some("degF"))));
        assert_eq!(read("relative_humidity_percent"), Ok((Quantity::RelativeHumidity, Some("%"))));
        assert_eq!(read("density_kg_m3"), Ok((Quantity::Density, Some("kg/m3"))));
        assert_eq!(read("velocity_m_s"), Ok((Quantity::Velocity, Some("m/s"))));
        assert_eq!(read("mach"), Ok((Quantity::Mach, None)));
        assert_eq!(read("n_N2_m3"), Ok((Quantity::NitrogenNumberDensity, Some("1/m3"))));
        assert_eq!(read("colour"), Err(ColumnError::Unknown));
        assert_eq!(
            read("altitude (furlong)"),
            Err(ColumnError::Unit { quantity: Quantity::Altitude, unit: "furlong" })
        );
        assert_eq!(
            Quantity::from_column("temperature_ft").unwrap_err().to_string(),
            "unknown unit 'ft' for the temperature; write K, degC, degF or degR"
        );
        // Every quantity's CSV column in either system reads back as itself.
        for q in Quantity::ALL.iter().copied() {
            for unit in [q.info().si, q.info().us] {
                let heading = if unit.suffix().is_empty() {
                    q.name().into()
                } else {
                    std::format!("{}_{}", q.name(), unit.suffix())
                };
                let c = Quantity::from_column(&heading).unwrap_or_else(|e| panic!("{heading}: {e}"));
                assert_eq!(c.quantity, q, "{heading}");
                assert_eq!(c.unit.unwrap_or(&ONE).to_si(7.0), unit.to_si(7.0), "{heading}");
            }
        }
    }
}
