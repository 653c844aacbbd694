//! `aerostrata altitude`: pressure altitude (and, on request, density altitude and the
//! barometric altitude relative to a QNH setting or the pad's pressure) from static
//! pressures given on the command line or read one per line.

use std::fs::File;
use std::io::{self, BufRead, BufReader, BufWriter, Write};
use std::path::PathBuf;

use aerostrata::inverse::{
    barometric_altitude_m, density_altitude_from, pressure_altitude, BarometricReference,
};
use clap::{ArgGroup, Args};

use crate::output::exact;
use crate::Failure;

#[derive(Args)]
#[command(group(ArgGroup::new("input").required(true).args(["pressure", "file"])))]
pub struct AltitudeArgs {
    /// Static pressure, Pa.
    #[arg(long, value_name = "PA", allow_negative_numbers = true)]
    pressure: Option<f64>,
    /// File of static pressures in Pa, one per line, instead of --pressure; `-` reads
    /// stdin. Blank lines and lines starting with `#` are skipped.
    file: Option<PathBuf>,
    /// Altimeter setting QNH, Pa: adds the altitude an altimeter set to it reads.
    #[arg(long, value_name = "PA", allow_negative_numbers = true, conflicts_with = "pad")]
    qnh: Option<f64>,
    /// The pad's pressure at launch, Pa: adds the height above the pad.
    #[arg(long, value_name = "PA", allow_negative_numbers = true)]
    pad: Option<f64>,
    /// Outside air temperature, K: adds the density altitude (dry air).
    #[arg(long, value_name = "K", allow_negative_numbers = true)]
    temperature: Option<f64>,
}

pub fn run(args: &AltitudeArgs) -> Result<(), Failure> {
    let reference = match (args.qnh, args.pad) {
        (Some(setting_pa), _) => Some(("qnh_altitude_m", "--qnh", BarometricReference::Qnh { setting_pa })),
        (_, Some(pressure_pa)) => {
            Some(("height_above_pad_m", "--pad", BarometricReference::Pad { pressure_pa }))
        }
        _ => None,
    };
    // Check the reference once, up front, so that its error names its option.
    if let Some((_, option, reference)) = reference {
        barometric_altitude_m(101_325.0, reference).map_err(|e| Failure::Input(format!("{option}: {e}")))?;
    }
    let mut header = vec!["pressure_Pa", "pressure_altitude_m", "pressure_altitude_geometric_m"];
    header.extend(reference.map(|(name, _, _)| name));
    if args.temperature.is_some() {
        header.push("density_altitude_m");
    }
    let row = |pressure: f64| -> Result<String, String> {
        let h = pressure_altitude(pressure).map_err(|e| e.to_string())?;
        let mut cells = vec![exact(pressure), exact(h.meters()), exact(h.to_geometric().meters())];
        if let Some((_, _, reference)) = reference {
            cells.push(exact(barometric_altitude_m(pressure, reference).map_err(|e| e.to_string())?));
        }
        if let Some(t) = args.temperature {
            let d = density_altitude_from(pressure, t).map_err(|e| format!("--temperature: {e}"))?;
            cells.push(exact(d.meters()));
        }
        Ok(cells.join(","))
    };
    // A single pressure is checked before anything is written, so a bad one leaves stdout empty.
    let single =
        args.pressure.map(|p| row(p).map_err(|m| Failure::Input(format!("--pressure: {m}")))).transpose()?;
    let mut out = BufWriter::new(io::stdout().lock());
    writeln!(out, "{}", header.join(","))?;
    if let Some(line) = single {
        writeln!(out, "{line}")?;
    } else if let Some(path) = &args.file {
        let input: Box<dyn BufRead> = if path.as_os_str() == "-" {
            Box::new(io::stdin().lock())
        } else {
            Box::new(BufReader::new(
                File::open(path)
                    .map_err(|e| Failure::Input(format!("cannot open {}: {e}", path.display())))?,
            ))
        };
        for (index, line) in input.lines().enumerate() {
            let line_number = index + 1;
            let line = line.map_err(|e| Failure::Input(format!("line {line_number}: cannot read: {e}")))?;
            let text = line.trim();
            if text.is_empty() || text.starts_with('#') {
                continue;
            }
            let pressure: f64 = text.parse().map_err(|_| {
                Failure::Input(format!("line {line_number}: '{text}' is not a pressure (a number of Pa)"))
            })?;
            let line = row(pressure).map_err(|m| Failure::Input(format!("line {line_number}: {m}")))?;
            writeln!(out, "{line}")?;
        }
    }
    out.flush()?;
    Ok(())
}
