//! The reference vectors of `tests/vectors`, embedded by build.rs, and their evaluation
//! through the core along the same path as `crates/xtask/src/rust/vectors.rs` (the native
//! check): the state at the row's altitude for `us1976` files, the species from
//! `US1976.species`, the isentropic ratios (with `qc_p`) and the normal-shock quantities
//! (with `p1_p02 = 1 / p02_p1`) for the compressible-flow files.

use aerostrata::quantity::Group;
use aerostrata::{Altitude, Atmosphere, Error, PerfectGas, Quantity, State, TemperatureOffset, US1976};

/// A `# model:` line, parsed at build time.
#[derive(Clone, Copy)]
pub enum Model {
    /// The 1976 standard, optionally with a temperature offset, K.
    Us1976 { offset_k: Option<f64> },
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
pub enum Evaluator {
    Standard,
    Offset(TemperatureOffset<aerostrata::Us1976>),
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
            Evaluator::Isentropic(gas) => {
                if input != Input::Mach {
                    return Err(Failure::Input("(expected mach)"));
                }
                return Ok(Evaluated::Flow(FlowValues::isentropic(gas, value)?));
            }
            Evaluator::NormalShock(gas) => {
                if input != Input::Mach {
                    return Err(Failure::Input("(expected mach)"));
                }
                return Ok(Evaluated::Flow(FlowValues::normal_shock(gas, value)?));
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

/// The named values of a compressible-flow row.
pub struct FlowValues {
    values: [(&'static str, f64); 7],
    len: usize,
}

impl FlowValues {
    fn isentropic(gas: &PerfectGas, mach: f64) -> Result<Self, Error> {
        Ok(FlowValues {
            values: [
                ("p_p0", gas.pressure_ratio(mach)?),
                ("rho_rho0", gas.density_ratio(mach)?),
                ("t_t0", gas.temperature_ratio(mach)?),
                ("a_astar", gas.area_ratio(mach)?),
                ("qc_p", gas.impact_pressure_ratio(mach)?),
                ("", 0.0),
                ("", 0.0),
            ],
            len: 5,
        })
    }

    fn normal_shock(gas: &PerfectGas, mach: f64) -> Result<Self, Error> {
        let shock = gas.normal_shock(mach)?;
        Ok(FlowValues {
            values: [
                ("m2", shock.downstream_mach),
                ("p2_p1", shock.pressure_ratio),
                ("rho2_rho1", shock.density_ratio),
                ("t2_t1", shock.temperature_ratio),
                ("p02_p01", shock.total_pressure_ratio),
                ("p02_p1", shock.pitot_pressure_ratio),
                ("p1_p02", 1.0 / shock.pitot_pressure_ratio),
            ],
            len: 7,
        })
    }
}

/// The computed values of one row.
pub enum Evaluated {
    State(State, Altitude),
    Flow(FlowValues),
}

impl Evaluated {
    /// The value `column` names: `None` if no such quantity, `Some(None)` where the model
    /// defines none.
    pub fn value(&self, column: &str) -> Option<Option<f64>> {
        match self {
            Evaluated::State(state, altitude) => {
                // Through the quantity catalogue, as the native check: a state quantity
                // or a species, written in its SI unit (`temperature_K`).
                let read = Quantity::from_column(column).ok()?;
                let q = read.quantity;
                if read.unit.is_some_and(|unit| unit != q.si()) {
                    return None;
                }
                match q.info().group {
                    Group::State => Some(state.get(q).ok()),
                    Group::Species => {
                        let index = Quantity::of_group(Group::Species).position(|s| s == q)?;
                        Some(US1976.species(*altitude).ok().map(|n| n.as_array()[index]))
                    }
                    _ => None,
                }
            }
            Evaluated::Flow(flow) => {
                flow.values[..flow.len].iter().find(|(name, _)| *name == column).map(|(_, v)| Some(*v))
            }
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
