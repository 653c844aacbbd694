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

#[macro_use]
mod aero;
mod args;
mod batch;
mod error;
#[cfg(feature = "full")]
mod flight;
#[cfg(feature = "full")]
mod flow;
#[cfg(feature = "full")]
mod input;
mod js;
#[cfg(feature = "full")]
mod loads;
mod model;
#[cfg(feature = "full")]
mod models;
mod naming;
mod quantity;
mod text;
mod upper;

pub use aero::*;
pub use error::{Class, Failure};
#[cfg(feature = "full")]
pub use flow::*;
#[cfg(feature = "full")]
pub use input::{model_grammar, parse_value, read_flight_csv};
#[cfg(feature = "full")]
pub use loads::WindProfile;
pub use model::{standard_species, standard_state, AtmosphereModel};
pub use quantity::{from_us, quantities, to_us};
pub use upper::upper_loaded;

use wasm_bindgen::prelude::*;

/// The version of the package, for example "0.1.0" (the crate's version).
#[wasm_bindgen(js_name = version)]
pub fn version() -> alloc::string::String {
    alloc::string::String::from(env!("CARGO_PKG_VERSION"))
}

/// Runs once when the module is instantiated: makes the methods of a freed
/// `AtmosphereModel` or `WindProfile` throw an `Error` that says it was freed, and adds
/// `AtmosphereModel.batchInto` (see `guardFreed` in glue.js), by reaching each class's
/// prototype through a throwaway object, and hands glue.js the module's memory, where
/// `batchInto` reads and writes its chunks through views (batch.rs).
#[wasm_bindgen(start, skip_typescript, js_name = __aerostrataStart)]
fn start() {
    js::use_memory(wasm_bindgen::memory());
    let keys = quantity::keys(aerostrata::Quantity::of_group(aerostrata::quantity::Group::State));
    let model = JsValue::from(AtmosphereModel::from_model(model::Model::Us1976));
    js::guard_freed(model, "AtmosphereModel", "model", &keys);
    #[cfg(feature = "full")]
    if let Some(calm) = WindProfile::calm() {
        js::guard_freed(JsValue::from(calm), "WindProfile", "wind profile", "");
    }
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

/**
 * Loads the upper atmosphere's tables (86 to 1000 km), which the module leaves out of its
 * default download: until then every call that needs an altitude above 86 km (a state,
 * species, an offset model or a sounding's blend up there, a flight scan or an inverse
 * reaching there) throws an `Error` that says to call this first. With no argument it
 * fetches `aerostrata_upper.bin` beside the module (browsers and bundlers) or reads it
 * (Node); or give the file's URL, a fetched `Response`, or its bytes. Loading again, or
 * while a load is under way, costs nothing more. A file other than the module's own is
 * refused with an `Error` that says why. The numbers are then the native core's, bit for
 * bit.
 */
export function loadUpper(source?: string | URL | Response | Uint8Array | ArrayBuffer): Promise<void>;

/**
 * Loads the module's full part, which the default module leaves out: every model beyond
 * the standard (`hydrostaticOffset` is in the default module; `exponential`, `isothermal`,
 * `layered`, `tabulated`, soundings, `fromSpec`), flight scans and winds
 * (`scanFlight`, `WindProfile`), `terminalVelocityMS` and drag tables, compressible flow,
 * airspeeds and altimetry, and the readers of values with units and of files
 * (`parseValue`, `readFlightCsv`, `modelGrammar`). Until then each of them throws an
 * `Error` that says to call this first. With no argument it fetches
 * `full/aerostrata_bg.wasm` beside the package's entry (browsers and bundlers) or reads it
 * (Node, which takes no argument); or give its URL, a fetched `Response`, its bytes or a
 * compiled `WebAssembly.Module`. Loading again costs nothing more. Models made before it
 * are made again in the full part, from the same arguments, when one of its methods is
 * first called on them: the same numbers, bit for bit.
 */
export function loadFull(source?: string | URL | Response | Uint8Array | ArrayBuffer | WebAssembly.Module): Promise<void>;

/** Whether the module's full part is loaded (`loadFull`). */
export function fullLoaded(): boolean;

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

/**
 * What `readFlightCsv` returns: the samples in SI (the columns the file gives), and the
 * headings kept out. `{ignored, ...samples}` is what `scanFlight(options)` takes.
 */
export interface FlightSamples {
  timeS: Float64Array;
  altitudeM: Float64Array;
  /** The speed (without components), or with flightPathAngleDeg and headingDeg the ground-relative speed. */
  velocityMS?: Float64Array;
  velocityEastMS?: Float64Array;
  velocityNorthMS?: Float64Array;
  velocityUpMS?: Float64Array;
  flightPathAngleDeg?: Float64Array;
  headingDeg?: Float64Array;
  axisElevationDeg?: Float64Array;
  axisAzimuthDeg?: Float64Array;
  ignored: string[];
}

export interface AtmosphereModel {
  /**
   * Batch evaluation into the caller's arrays: for every altitude of `altitudesM` (metres
   * of `altitudeKind`), each quantity of the state that `outputs` names, written to
   * `outputs[name][i]`. `outputs` maps names of `AtmosphereState` to `Float64Array`s of
   * `altitudesM.length` elements each; returns `outputs`.
   *
   * Memory: the caller's arrays (8 bytes per value) and, inside the module, one buffer
   * the model keeps for a chunk of 16 384 altitudes and its columns (2.6 MiB with all 20
   * quantities), reused by every later call: no arrays are made per call, so a page
   * redrawing a chart from the same arrays makes no garbage. A `Float64Array` of
   * altitudes is the fast path; an array of numbers is checked element by element as in
   * `batch`. Not all or nothing: the first bad altitude throws as in `batch` (naming its
   * index in the whole array), and elements before it may already have been written.
   */
  batchInto(
    altitudesM: Float64Array | number[],
    outputs: Partial<Record<StateQuantity, Float64Array>>,
    altitudeKind?: AltitudeKind,
  ): Partial<Record<StateQuantity, Float64Array>>;
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
  /** Airspeed there (speed relative to the air; the speed given, without winds), m/s. */
  velocityMS: number;
  /** Mach number there (`null` where a sample has none). */
  mach: number | null;
  /** The maximum dynamic pressure, Pa: never below the largest sample. */
  dynamicPressurePa: number;
  /** Index of the largest sample. */
  sampleIndex: number;
  /** Whether the parabola refined it (false at the ends of the flight). */
  refined: boolean;
  /** The largest sampled dynamic pressure, Pa. */
  sampleMaxPa: number;
  /** How far the maximum of the sampled flight can be from `dynamicPressurePa`, Pa; `null` when the largest sample is the first or the last. */
  uncertaintyPa: number | null;
  /** Whether the sampling resolves the peak (the uncertainty at most 0.1 % of it). */
  resolved: boolean;
  /** Where the peak is bounded but not resolved, a sample spacing that would resolve it, s. */
  suggestedSpacingS: number | null;
}

/** The largest value of a quantity over the samples. */
export interface FlightExtreme {
  /** The value (Mach number, drag in N, or q-alpha in Pa deg). */
  value: number;
  /** Time of the sample, s. */
  timeS: number;
  /** Geometric altitude of the sample, m. */
  altitudeM: number;
  /** Airspeed of the sample, m/s. */
  velocityMS: number;
  /** Index of the sample. */
  sampleIndex: number;
  /** Mach number of the sample (`null` where undefined). */
  mach: number | null;
}

/** Crossings of Mach 1 in one direction. */
export interface MachCrossings {
  count: number;
  /** Time of the first, s. */
  firstTimeS: number | null;
  /** Time of the last, s. */
  lastTimeS: number | null;
}

/** One interval where a series exceeds its limit, the crossings interpolated linearly between samples. */
export interface Exceedance {
  /** When it rose above the limit, s (the first sample's time when it starts above). */
  startTimeS: number;
  /** When it fell back to the limit, s (the last sample's time when it ends above). */
  endTimeS: number;
  /** The largest sampled value in the interval. */
  peak: number;
  /** Time of that sample, s. */
  peakTimeS: number;
  /** Already above the limit at the first sample. */
  openStart: boolean;
  /** Still above the limit at the last sample. */
  openEnd: boolean;
}

/** The span around the maximum q where q stays at least (1 - fraction) times the maximum. */
export interface Plateau {
  startTimeS: number;
  endTimeS: number;
  /** The maximum it is measured from (the refined maximum q), Pa. */
  maximum: number;
  fraction: number;
  /** Whether it reaches the first or the last sample. */
  open: boolean;
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
  /** Largest q-alpha, Pa deg (samples with the velocity's direction). */
  maxQAlpha: FlightExtreme | null;
  /** Samples without a Mach number (above 86 km): a Mach 1 crossing among them cannot be seen. */
  machUndefinedSamples: number;
  /** Samples beyond the wind profile's levels, where the nearest level's wind was held. */
  windHeldSamples: number;
  /** The q plateau (at `plateauFraction`, 0.02 by default). */
  qPlateau: Plateau | null;
  /** The intervals above `qLimitPa` (when given). */
  qExceedances?: Exceedance[];
  /** The intervals above `qAlphaLimitPaDeg` (when given). */
  qAlphaExceedances?: Exceedance[];
}

/** What `AtmosphereModel.scanFlight` returns. */
export interface FlightScanResult {
  points: FlightPoints;
  summary: FlightSummary;
}

/** Winds aloft for a flight scan: a profile, or its levels as arrays (geometric altitudes, m; m/s; the direction the wind blows from, deg). */
export type WindsSpec =
  | WindProfile
  | { altitudeM: Float64Array | number[]; windEastMS: Float64Array | number[]; windNorthMS: Float64Array | number[] }
  | { altitudeM: Float64Array | number[]; windSpeedMS: Float64Array | number[]; windDirectionDeg: Float64Array | number[] };

/** The wind at one altitude (`WindProfile.at`). */
export interface WindAt {
  windEastMS: number;
  windNorthMS: number;
  windSpeedMS: number;
  /** The direction it blows from, deg clockwise from true north, in [0, 360). */
  windDirectionDeg: number;
  /** Whether the altitude lies beyond the levels and the nearest level's wind is held. */
  held: boolean;
}

/** A wind profile's levels. */
export interface WindLevels {
  altitudeM: Float64Array;
  windEastMS: Float64Array;
  windNorthMS: Float64Array;
}

/**
 * The options of `scanFlight(options)`: the samples (arrays of one length) and what to
 * compute. The velocity in one of three forms: `velocityMS` alone (speed relative to the
 * air); `velocityEastMS`, `velocityNorthMS`, `velocityUpMS` (ground-relative); or
 * `velocityMS`, `flightPathAngleDeg`, `headingDeg` (ground-relative speed and direction).
 */
export interface FlightScanOptions {
  timeS: Float64Array | number[];
  altitudeM: Float64Array | number[];
  velocityMS?: Float64Array | number[];
  velocityEastMS?: Float64Array | number[];
  velocityNorthMS?: Float64Array | number[];
  velocityUpMS?: Float64Array | number[];
  /** Angle of the ground-relative velocity above the horizontal, deg (-90 to 90). */
  flightPathAngleDeg?: Float64Array | number[];
  /** Direction of its horizontal part, deg clockwise from true north. */
  headingDeg?: Float64Array | number[];
  /** The vehicle's axis above the horizontal, deg; with `axisAzimuthDeg`. Along the ground velocity when omitted. */
  axisElevationDeg?: Float64Array | number[];
  axisAzimuthDeg?: Float64Array | number[];
  vehicle?: VehicleSpec;
  /** Winds aloft (needs the velocity's direction). */
  winds?: WindsSpec;
  /** The boundary layer of the recovery temperature. */
  boundaryLayer?: "laminar" | "turbulent";
  /** List the intervals where q exceeds this, Pa. */
  qLimitPa?: number;
  /** List the intervals where q-alpha exceeds this, Pa deg (needs the velocity's direction). */
  qAlphaLimitPaDeg?: number;
  /** The q plateau's fraction below the maximum (0 to 1, default 0.02). */
  plateauFraction?: number;
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
