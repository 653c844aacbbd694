//! `--cd`, `--cd-table`, `--interpolation`, `--area` and `--length`: the vehicle whose
//! drag and Reynolds number a flight scan adds, as `flight` and `plot flight` read it.

use aerostrata::aero::{DragCurve, Interpolation};
use aerostrata::flight::Vehicle;
use clap::{Args, ValueEnum};

use crate::args::value::{REFERENCE_AREA, REFERENCE_LENGTH};
use crate::failure::Failure;
use crate::units::UnitSystem;

/// The drag model of a vehicle, as the options give it.
#[derive(Args, Clone)]
pub struct VehicleArgs {
    /// A constant drag coefficient (with --area).
    #[arg(long, value_name = "CD", conflicts_with = "cd_table", allow_negative_numbers = true)]
    cd: Option<f64>,
    /// A drag table MACH:CD,MACH:CD,... with Mach increasing (with --area); the end values
    /// are held outside it.
    #[arg(long, value_name = "TABLE")]
    cd_table: Option<String>,
    /// How the drag table is read between its points.
    #[arg(long, value_enum, default_value_t = TableInterpolation::Cubic)]
    interpolation: TableInterpolation,
    #[arg(long, value_name = "AREA", allow_hyphen_values = true,
          help = REFERENCE_AREA.help("Reference area for the drag coefficient (with --cd or --cd-table)"))]
    area: Option<String>,
    #[arg(long, value_name = "LENGTH", allow_hyphen_values = true,
          help = REFERENCE_LENGTH.help("Reference length for the Reynolds number (with a drag coefficient and area)"))]
    length: Option<String>,
}

#[derive(Clone, Copy, ValueEnum)]
pub enum TableInterpolation {
    /// Straight lines between points.
    Linear,
    /// Monotone cubic (Fritsch-Carlson): no overshoot between points.
    Cubic,
}

/// Mach and Cd columns of a `--cd-table` value.
fn parse_table(text: &str) -> Result<(Vec<f64>, Vec<f64>), Failure> {
    let mut mach = Vec::new();
    let mut cd = Vec::new();
    for pair in text.split(',') {
        let parsed =
            pair.split_once(':').and_then(|(m, c)| Some((m.trim().parse().ok()?, c.trim().parse().ok()?)));
        let Some((m, c)) = parsed else {
            return Err(Failure::Input(format!("--cd-table: '{pair}' is not MACH:CD (two numbers)")));
        };
        mach.push(m);
        cd.push(c);
    }
    Ok((mach, cd))
}

/// The drag table's columns, owned, for [`VehicleArgs::vehicle`] to borrow.
pub struct DragTable(Option<(Vec<f64>, Vec<f64>)>);

impl VehicleArgs {
    /// The drag table's columns, parsed.
    ///
    /// # Errors
    /// [`Failure::Input`] for a malformed table.
    pub fn table(&self) -> Result<DragTable, Failure> {
        Ok(DragTable(self.cd_table.as_deref().map(parse_table).transpose()?))
    }

    /// The vehicle the options describe, if any.
    ///
    /// # Errors
    /// [`Failure::Input`] naming the option at fault.
    pub fn vehicle<'t>(
        &self,
        table: &'t DragTable,
        units: UnitSystem,
    ) -> Result<Option<Vehicle<'t>>, Failure> {
        let interpolation = match self.interpolation {
            TableInterpolation::Linear => Interpolation::Linear,
            TableInterpolation::Cubic => Interpolation::MonotoneCubic,
        };
        let drag = match (&table.0, self.cd) {
            (Some((mach, cd)), _) => Some(
                DragCurve::table(mach, cd, interpolation)
                    .map_err(|e| Failure::Input(format!("--cd-table: {e}")))?,
            ),
            (None, Some(cd)) => {
                Some(DragCurve::constant(cd).map_err(|e| Failure::Input(format!("--cd: {e}")))?)
            }
            (None, None) => None,
        };
        match (drag, &self.area) {
            (Some(drag), Some(area)) => {
                let area = REFERENCE_AREA.si(area, units)?;
                let vehicle = Vehicle::new(drag, area).map_err(|e| Failure::Input(format!("--area: {e}")))?;
                Ok(Some(match &self.length {
                    Some(length) => vehicle
                        .with_reference_length(REFERENCE_LENGTH.si(length, units)?)
                        .map_err(|e| Failure::Input(format!("--length: {e}")))?,
                    None => vehicle,
                }))
            }
            (Some(_), None) => Err(Failure::Input("--cd and --cd-table need --area".to_owned())),
            (None, Some(_)) => Err(Failure::Input("--area needs --cd or --cd-table".to_owned())),
            (None, None) if self.length.is_some() => {
                Err(Failure::Input("--length needs --cd or --cd-table and --area".to_owned()))
            }
            (None, None) => Ok(None),
        }
    }

    /// Whether a drag model or a reference area or length was given.
    pub fn given(&self) -> bool {
        self.cd.is_some() || self.cd_table.is_some() || self.area.is_some() || self.length.is_some()
    }
}
