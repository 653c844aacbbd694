//! The reference vectors of `tests/vectors`, embedded by build.rs, and their evaluation
//! through the core by the very code of the native check (`crates/xtask/src/rust/vectors.rs`):
//! the state at the row's altitude for `us1976` files, and the value of each column from
//! `crates/xtask/src/vector_values.rs`, included here.

use aerostrata::{
    Altitude, Atmosphere, Error, HydrostaticOffset, PerfectGas, State, TemperatureOffset, US1976,
};

#[path = "../../../crates/xtask/src/vector_values.rs"]
mod values;

/// A `# model:` line, parsed at build time.
#[derive(Clone, Copy)]
pub enum Model {
    /// The 1976 standard, optionally with a temperature offset, K.
    Us1976 { offset_k: Option<f64> },
    /// The standard shifted by `offset_k` in hydrostatic balance from `p0_pa`.
    HydrostaticOffset { offset_k: f64, p0_pa: f64 },
    /// Isentropic flow relations of a perfect gas (gamma 1.4 when absent).
    Isentropic { gamma: Option<f64> },
    /// Normal-shock relations of a perfect gas (gamma 1.4 when absent).
    NormalShock { gamma: Option<f64> },
}

/// What the first column holds.
#[derive(Clone, Copy, PartialEq, Eq)]
pub enum Input {
    GeometricAltitude,
    GeopotentialAltitude,
    Mach,
}

/// One reference cell: as written, as a double, and its tolerance.
pub struct Cell {
    pub text: &'static str,
    pub reference: f64,
    pub tolerance: f64,
}

/// One row: its line in the file, the input as written and as a double, and one cell per
/// value column (`None` where the file leaves it empty).
pub struct Row {
    pub line: u32,
    pub input_text: &'static str,
    pub input: f64,
    pub cells: &'static [Option<Cell>],
}

/// One vector file.
pub struct VectorFile {
    pub stem: &'static str,
    pub model_name: &'static str,
    pub model: Model,
    pub input: Input,
    pub input_name: &'static str,
    pub columns: &'static [&'static str],
    pub rows: &'static [Row],
}

include!(concat!(env!("OUT_DIR"), "/vectors.rs"));

/// Why a row could not be evaluated.
pub enum Failure {
    /// The core refused the input (the message names it).
    Core(Error),
    /// The file's input column does not suit its model.
    Input(&'static str),
}

impl core::fmt::Display for Failure {
    fn fmt(&self, f: &mut core::fmt::Formatter<'_>) -> core::fmt::Result {
        match self {
            Failure::Core(error) => write!(f, "{error}"),
            Failure::Input(name) => write!(f, "input column {name} does not suit the model"),
        }
    }
}

impl From<Error> for Failure {
    fn from(error: Error) -> Self {
        Failure::Core(error)
    }
}

/// The model a file names, built once per file.
// One evaluator lives at a time, on the stack (there is no heap to box into): its size is
// the hydrostatic day's seven shifted layers, 280 bytes.
#[allow(clippy::large_enum_variant)]
pub enum Evaluator {
    Standard,
    Offset(TemperatureOffset<aerostrata::Us1976>),
    Hydrostatic(HydrostaticOffset),
    Isentropic(PerfectGas),
    NormalShock(PerfectGas),
}

impl Evaluator {
    /// # Errors
    /// The core's error for a parameter it refuses (an offset, a ratio of specific heats).
    pub fn new(model: Model) -> Result<Self, Error> {
        let gas = |gamma: Option<f64>| gamma.map_or(Ok(PerfectGas::AIR), PerfectGas::new);
        Ok(match model {
            Model::Us1976 { offset_k: None } => Evaluator::Standard,
            Model::Us1976 { offset_k: Some(offset) } => {
                Evaluator::Offset(TemperatureOffset::new(US1976, offset)?)
            }
            Model::HydrostaticOffset { offset_k, p0_pa } => {
                Evaluator::Hydrostatic(HydrostaticOffset::new(offset_k, p0_pa)?)
            }
            Model::Isentropic { gamma } => Evaluator::Isentropic(gas(gamma)?),
            Model::NormalShock { gamma } => Evaluator::NormalShock(gas(gamma)?),
        })
    }

    /// Every value one row's input gives.
    ///
    /// # Errors
    /// The core's error for an input it refuses; an input column that does not suit the model.
    pub fn row(&self, input: Input, value: f64) -> Result<Evaluated, Failure> {
        let atmosphere: &dyn Atmosphere = match self {
            Evaluator::Standard => &US1976,
            Evaluator::Offset(offset) => offset,
            Evaluator::Hydrostatic(model) => model,
            Evaluator::Isentropic(gas) => {
                if input != Input::Mach {
                    return Err(Failure::Input("(expected mach)"));
                }
                return Ok(Evaluated::Isentropic(values::isentropic(gas, value)?));
            }
            Evaluator::NormalShock(gas) => {
                if input != Input::Mach {
                    return Err(Failure::Input("(expected mach)"));
                }
                return Ok(Evaluated::NormalShock(values::normal_shock(gas, value)?));
            }
        };
        let altitude = match input {
            Input::GeometricAltitude => Altitude::geometric_m(value)?,
            Input::GeopotentialAltitude => Altitude::geopotential_m(value)?,
            Input::Mach => return Err(Failure::Input("mach")),
        };
        Ok(Evaluated::State(atmosphere.state(altitude)?, altitude))
    }
}

/// The computed values of one row.
pub enum Evaluated {
    State(State, Altitude),
    Isentropic([(&'static str, f64); 5]),
    NormalShock([(&'static str, f64); 7]),
}

impl Evaluated {
    /// The value `column` names: `None` if no such quantity, `Some(None)` where the model
    /// defines none.
    pub fn value(&self, column: &str) -> Option<Option<f64>> {
        match self {
            Evaluated::State(state, altitude) => values::atmosphere(state, *altitude, column),
            Evaluated::Isentropic(columns) => values::flow(columns, column),
            Evaluated::NormalShock(columns) => values::flow(columns, column),
        }
    }
}

impl Cell {
    /// Whether `computed` is within the tolerance: `|computed - reference| <= tolerance`,
    /// the boundary a pass (tests/vectors/README.md).
    pub fn passes(&self, computed: f64) -> bool {
        (computed - self.reference).abs() <= self.tolerance
    }
}
