//! aerostrata's WebAssembly door: thin wasm-bindgen wrappers over the core crate, built
//! by `cargo xtask wasm` into the npm package `aerostrata` (an ES module for browsers and
//! bundlers, a Node build, TypeScript types). No formula lives here: every number comes
//! from the core, so the module gives the native core's bits.
//!
//! The conventions, which every export follows:
//! - JS names in camelCase through `js_name`, each with its unit in the name (`pressurePa`,
//!   `densityKgM3`, `velocityMS`) or in the doc comment that becomes its JSDoc;
//! - every argument arrives as a `JsValue` and is read through `glue.js` (modules `js` and
//!   `args`): a number must be a JS number, an array a `Float64Array` or an array of
//!   numbers (wasm-bindgen's own `f64` parameters would turn `null` into 0 without a
//!   word); results are assembled into plain objects there too, so that the module makes
//!   one call across the boundary per result rather than one per property;
//! - every failure is a thrown JS error (`error`): `TypeError` for a wrong JS type,
//!   `RangeError` for a value out of its range (the message names the value and the
//!   range), `Error` otherwise;
//! - nothing panics: no indexing that can fail, no `unwrap`, arrays bounded before they
//!   are copied into the module's memory (a panic in wasm is a trap that leaves the
//!   module unusable, so the Node tests throw garbage at every export).

#![no_std]
#![warn(missing_docs)]

extern crate alloc;
#[cfg(not(feature = "standalone"))]
extern crate std;

/// What `std` would otherwise provide (see the `standalone` feature in Cargo.toml).
#[cfg(all(feature = "standalone", target_arch = "wasm32"))]
mod standalone {
    #[global_allocator]
    static ALLOCATOR: talc::wasm::WasmDynamicTalc = talc::wasm::new_wasm_dynamic_allocator();

    /// No panic is reachable (see the crate docs); if one were, it traps, and the JS
    /// caller sees a `WebAssembly.RuntimeError`.
    #[panic_handler]
    fn panic(_: &core::panic::PanicInfo<'_>) -> ! {
        core::arch::wasm32::unreachable()
    }
}

mod aero;
mod args;
mod error;
mod flight;
mod input;
mod js;
mod model;
mod naming;
mod quantity;
mod text;

pub use aero::*;
pub use error::{Class, Failure};
pub use input::{model_grammar, parse_value, read_flight_csv};
pub use model::{standard_species, standard_state, AtmosphereModel};
pub use quantity::{from_us, quantities, to_us};

use wasm_bindgen::prelude::*;

/// The version of the package, for example "0.1.0" (the crate's version).
#[wasm_bindgen(js_name = version)]
pub fn version() -> alloc::string::String {
    alloc::string::String::from(env!("CARGO_PKG_VERSION"))
}

/// The TypeScript types of the catalogue's quantities, written by build.rs from the core's
/// catalogue.
#[wasm_bindgen(typescript_custom_section)]
const CATALOGUE_TYPES: &'static str = include_str!(concat!(env!("OUT_DIR"), "/catalogue.d.ts"));

#[wasm_bindgen(typescript_custom_section)]
const TYPES: &'static str = r#"
/** What the catalogue says of one quantity (`quantities()`). */
export interface QuantityInfo {
  /** The stable id (the C interface's AEROSTRATA_QUANTITY_* value). */
  id: number;
  /** The machine name every door shares, snake_case (`speed_of_sound`). */
  name: QuantityName;
  /** The property name in this module's result objects (`speedOfSoundMS`). */
  key: string;
  /** The short symbol of tables (`a`). */
  symbol: string;
  /** A label for people, lower case but for proper names (`speed of sound`). */
  label: string;
  /** One line of what it is. */
  description: string;
  /** The SI unit's symbol; every value in and out of this module is in it. */
  siUnit: string;
  /** The US customary unit's symbol, for `toUs` and `fromUs`. */
  usUnit: string;
  /** The CSV column in SI units, as the command-line tool writes it. */
  siColumn: string;
  /** The CSV column in US units. */
  usColumn: string;
  /** Which result carries it. */
  group: "state" | "species" | "flight" | "airspeed" | "altimetry" | "parameter" | "wind";
  /** Whether it can be undefined (the continuum properties above 86 km, a drag without a vehicle). */
  mayBeUndefined: boolean;
  /** Decimals for people, or `null` for six significant digits. */
  decimals: number | null;
  /** Shown in compact tables. */
  primary: boolean;
}

/** Which kind of altitude a number is: geometric (above mean sea level, m) or geopotential (geopotential m). */
export type AltitudeKind = "geometric" | "geopotential";

/** The kinds of model `AtmosphereModel` holds. */
export type ModelKind = "standard" | "hydrostaticOffset" | "exponential" | "isothermal" | "layered" | "tabulated";

/** What `parseValue` returns. */
export interface ParsedValue {
  /** The value in the quantity's SI unit. */
  si: number;
  /** The number as written. */
  value: number;
  /** The symbol of the unit it was read in. */
  unit: string;
  /** Whether the text named the unit. */
  explicit: boolean;
}

/** What `readFlightCsv` returns: the samples in SI, and the headings kept out. */
export interface FlightSamples {
  timeS: Float64Array;
  altitudeM: Float64Array;
  velocityMS: Float64Array;
  ignored: string[];
}

/** The altitudes a model accepts. */
export interface AltitudeRange {
  /** Lowest geometric altitude, m. */
  geometricMinM: number;
  /** Highest geometric altitude, m. */
  geometricMaxM: number;
  /** Lowest geopotential altitude, geopotential m. */
  geopotentialMinM: number;
  /** Highest geopotential altitude, geopotential m. */
  geopotentialMaxM: number;
}

/**
 * The optional columns of `AtmosphereModel.tabulated`, each with one entry per row and
 * `null` where a row does not give the value.
 */
export interface TableColumns {
  /** Pressure, Pa: on every row, or on the first row only. */
  pressurePa?: Float64Array | (number | null)[];
  /** Density of the (moist) air, kg/m^3, on every row (instead of pressure). */
  densityKgM3?: Float64Array | (number | null)[];
  /** Dew point, K. */
  dewPointK?: Float64Array | (number | null)[];
  /** Relative humidity over water, %. */
  relativeHumidityPercent?: Float64Array | (number | null)[];
  /** Below the first row, blend into the 1976 standard over this many geopotential metres. */
  blendBelowM?: number;
  /** Above the last row, blend into the 1976 standard over this many geopotential metres. */
  blendAboveM?: number;
}

/** One row of a sounding's JSON form (SI units; absent or `null` is "not given"). */
export interface SoundingJsonRow {
  /** Altitude, m, of the table's kind. */
  altitude_m: number;
  /** Kinetic temperature, K. */
  temperature_k: number;
  /** Pressure, Pa. */
  pressure_pa?: number | null;
  /** Density, kg/m^3. */
  density_kg_m3?: number | null;
  /** Dew point, K. */
  dew_point_k?: number | null;
  /** Relative humidity over water, %. */
  relative_humidity_percent?: number | null;
}

/** What a table does beyond its edge: an error, or a blend into the 1976 standard over `depth_m` geopotential metres. */
export type SoundingOutside = "error" | { blend_into_us1976: { depth_m: number } };

/** A sounding's JSON form, as the command-line tool reads it. */
export interface SoundingJson {
  altitude: AltitudeKind;
  rows: SoundingJsonRow[];
  below?: SoundingOutside;
  above?: SoundingOutside;
}

/** A drag-coefficient table: Mach numbers (increasing, 0 to 1000) and their Cd (above 0, at most 100). */
export interface DragTable {
  mach: Float64Array | number[];
  cd: Float64Array | number[];
  /** Between points: a monotone cubic (the default) or straight lines. */
  interpolation?: "monotoneCubic" | "linear";
}

/** A drag coefficient: a constant, or a table against Mach number. */
export type DragSpec = number | DragTable;

/** The vehicle of a flight scan. */
export interface VehicleSpec {
  /** Drag coefficient, constant or against Mach number. */
  drag: DragSpec;
  /** Reference area of the drag coefficient, m^2. */
  referenceAreaM2: number;
  /** Reference length for the Reynolds number, m. */
  referenceLengthM?: number;
}

/** The maximum dynamic pressure, refined between samples by a parabola through the three largest. */
export interface DynamicPressurePeak {
  /** Time of the maximum, s. */
  timeS: number;
  /** Geometric altitude there, m. */
  altitudeM: number;
  /** Velocity there, m/s. */
  velocityMS: number;
  /** Mach number there (`null` where a sample has none). */
  mach: number | null;
  /** The maximum dynamic pressure, Pa. */
  dynamicPressurePa: number;
  /** Index of the largest sample. */
  sampleIndex: number;
  /** Whether the parabola refined it (false at the ends of the flight). */
  refined: boolean;
}

/** The largest value of a quantity over the samples. */
export interface FlightExtreme {
  /** The value (Mach number, or drag in N). */
  value: number;
  /** Time of the sample, s. */
  timeS: number;
  /** Geometric altitude of the sample, m. */
  altitudeM: number;
  /** Velocity of the sample, m/s. */
  velocityMS: number;
  /** Index of the sample. */
  sampleIndex: number;
}

/** Crossings of Mach 1 in one direction. */
export interface MachCrossings {
  count: number;
  /** Time of the first, s. */
  firstTimeS: number | null;
  /** Time of the last, s. */
  lastTimeS: number | null;
}

/** The summary of a scanned flight. */
export interface FlightSummary {
  samples: number;
  maxDynamicPressure: DynamicPressurePeak | null;
  maxMach: FlightExtreme | null;
  machOneUp: MachCrossings;
  machOneDown: MachCrossings;
  /** Largest drag, N (with a vehicle). */
  maxDrag: FlightExtreme | null;
}

/** What `AtmosphereModel.scanFlight` returns. */
export interface FlightScanResult {
  points: FlightPoints;
  summary: FlightSummary;
}

/** Static-to-total ratios of isentropic flow. */
export interface IsentropicRatios {
  mach: number;
  /** p / pt. */
  pressureRatio: number;
  /** T / Tt. */
  temperatureRatio: number;
  /** rho / rhot. */
  densityRatio: number;
}

/** Normal-shock relations. */
export interface NormalShockRatios {
  upstreamMach: number;
  downstreamMach: number;
  /** p2 / p1. */
  pressureRatio: number;
  /** rho2 / rho1. */
  densityRatio: number;
  /** T2 / T1. */
  temperatureRatio: number;
  /** pt2 / pt1. */
  totalPressureRatio: number;
  /** pt2 / p1 (Rayleigh pitot). */
  pitotPressureRatio: number;
}

/** The kind of an airspeed given to `airspeeds`. */
export type AirspeedKind = "calibrated" | "equivalent" | "true" | "mach";

/** What a barometric altitude is measured from. */
export type BarometricReferenceSpec = "standard" | { qnhPa: number } | { padPressurePa: number };

/** Regimes of rarefied-gas dynamics by Knudsen number. */
export type RarefactionRegime = "continuum" | "slip" | "transitional" | "freeMolecular";

/** Exact factors to SI: a value in the unit times its factor is the SI value. */
export interface UnitFactors {
  /** International foot, m. */
  footM: number;
  /** Knot, m/s. */
  knotMS: number;
  /** Pound-force, N. */
  poundForceN: number;
  /** Pound-force per square foot, Pa. */
  psfPa: number;
  /** Pound-force per square inch, Pa. */
  psiPa: number;
  /** Inch of mercury (conventional), Pa. */
  inHgPa: number;
  /** Hectopascal, Pa. */
  hPaPa: number;
  /** Slug, kg. */
  slugKg: number;
  /** Slug per cubic foot, kg/m^3. */
  slugPerFt3KgM3: number;
  /** Degree Rankine (or Fahrenheit interval), K. */
  rankineK: number;
  /** 0 degC, K. */
  celsiusZeroK: number;
}
"#;
