//! The summary `flight` writes on stderr, for a person (text) or a program (JSON): per
//! model the core's summary (maximum q with its sampled maximum, uncertainty and whether
//! the sampling resolves it, maximum q-alpha, Mach and drag, the Mach 1 crossings, the
//! samples where the Mach number or the wind is not known), the limit exceedances and
//! the q plateau; with several models, the worst case of each load and the model that
//! gives it. The caution ends every summary.

use aerostrata::flight::{Exceedance, FlightSummary, Plateau};
use aerostrata::Quantity;
use serde_json::{json, Map, Value};

use crate::format::fixed;
use crate::units::{column, UnitSystem};

/// The caution's text, as a literal for `concat!`.
macro_rules! caution {
    () => {
        "Not certified flight software; verify independently; local codes, range-safety rules and licensed \
         engineering practice govern."
    };
}
pub(crate) use caution;

/// The caution that ends `flight --help`, its manual page and every flight summary.
pub const CAUTION: &str = caution!();

/// The limits watched, with what they found.
pub struct Exceeded {
    /// The quantity (dynamic pressure or q-alpha).
    pub quantity: Quantity,
    /// The limit, SI.
    pub limit: f64,
    /// The intervals above it.
    pub intervals: Vec<Exceedance>,
}

/// What `flight` reports of one model.
pub struct Report {
    /// The model's name.
    pub label: String,
    /// The core's summary.
    pub summary: FlightSummary,
    /// Whether the scan had winds.
    pub winds: bool,
    /// Whether the samples gave their velocity's direction (q-alpha is known).
    pub directed: bool,
    /// The limits watched.
    pub limits: Vec<Exceeded>,
    /// The q plateau.
    pub plateau: Option<Plateau>,
}

impl Report {
    /// The largest value of a load over the flight, SI: maximum q (refined), q-alpha, drag.
    fn load(&self, quantity: Quantity) -> Option<f64> {
        let s = &self.summary;
        match quantity {
            Quantity::DynamicPressure => s.max_dynamic_pressure.map(|p| p.dynamic_pressure_pa),
            Quantity::QAlpha => s.max_q_alpha.map(|e| e.value),
            Quantity::Drag => s.max_drag.map(|e| e.value),
            _ => None,
        }
    }
}

/// The loads an envelope of several models compares.
const LOADS: [Quantity; 3] = [Quantity::DynamicPressure, Quantity::QAlpha, Quantity::Drag];

/// For each load, the report that gives its largest value and that value.
fn worst(reports: &[Report]) -> Vec<(Quantity, &Report, f64)> {
    LOADS
        .iter()
        .filter_map(|q| {
            reports
                .iter()
                .filter_map(|r| r.load(*q).map(|v| (r, v)))
                .reduce(|a, b| if b.1 > a.1 { b } else { a })
                .map(|(r, v)| (*q, r, v))
        })
        .collect()
}

/// A value with its unit in `units`, with `decimals` decimals.
fn value(units: UnitSystem, q: Quantity, si: f64, decimals: usize) -> String {
    format!("{} {}", fixed(units.from_si(q, si), decimals), units.unit(q).symbol())
}

/// The summaries for a person; with several models, each under its name and then the
/// worst case of each load.
pub fn text(reports: &[Report], units: UnitSystem) -> String {
    let mut text = String::new();
    let several = reports.len() > 1;
    for report in reports {
        if several {
            text += &format!("model: {}\n", report.label);
        }
        text += &one_text(report, units);
    }
    if several {
        for (q, report, v) in worst(reports) {
            let info = q.info();
            text +=
                &format!("worst case: max {} {} ({})\n", info.symbol, value(units, q, v, 1), report.label);
        }
    }
    text + CAUTION + "\n"
}

fn one_text(report: &Report, units: UnitSystem) -> String {
    let s = &report.summary;
    let v = |q: Quantity, si: f64, decimals: usize| value(units, q, si, decimals);
    let [t, q, altitude, velocity, drag, qa] = [
        Quantity::Time,
        Quantity::DynamicPressure,
        Quantity::Altitude,
        Quantity::Velocity,
        Quantity::Drag,
        Quantity::QAlpha,
    ]
    .map(Quantity::info);
    let time = |time_s: f64| format!("{} = {}", t.symbol, v(Quantity::Time, time_s, 4));
    let at = |time_s: f64, altitude_m: f64| {
        format!("at {}, {} {}", time(time_s), altitude.label, v(Quantity::Altitude, altitude_m, 1))
    };
    let mach =
        |m: Option<f64>| m.map_or_else(|| "Mach undefined".to_owned(), |m| format!("Mach {}", fixed(m, 4)));
    let mut text = format!("samples: {}\n", s.samples);
    match &s.max_dynamic_pressure {
        Some(p) => {
            let how = if p.refined {
                format!("parabola through samples {} to {}", p.sample_index - 1, p.sample_index + 1)
            } else {
                format!("sample {}, not refined", p.sample_index)
            };
            text += &format!(
                "max {}: {} {}, {} {}, {} ({how})\n",
                q.symbol,
                v(Quantity::DynamicPressure, p.dynamic_pressure_pa, 1),
                at(p.time_s, p.altitude_m),
                velocity.label,
                v(Quantity::Velocity, p.velocity_m_s, 2),
                mach(p.mach)
            );
            let bound = p.uncertainty_pa.map_or_else(
                || "uncertainty unknown (the largest sample is the first or the last)".to_owned(),
                |u| format!("uncertainty +- {}", v(Quantity::DynamicPressure, u, 1)),
            );
            let resolved = if p.resolved { "resolved" } else { "not resolved" };
            text += &format!(
                "  sampled maximum {}, {bound}: {resolved}\n",
                v(Quantity::DynamicPressure, p.sample_max_pa, 1)
            );
            if let (false, Some(spacing)) = (p.resolved, p.suggested_spacing_s) {
                text += &format!(
                    "  resample at {} or finer around t = {} to resolve the maximum\n",
                    v(Quantity::Time, spacing, 4),
                    v(Quantity::Time, p.time_s, 4)
                );
            }
        }
        None => text += &format!("max {}: no samples\n", q.symbol),
    }
    if let Some(p) = &report.plateau {
        text += &format!(
            "{} plateau (within {} % of the maximum): {} to {} ({}){}\n",
            q.symbol,
            fixed(p.fraction * 100.0, 1),
            time(p.start_time_s),
            v(Quantity::Time, p.end_time_s, 4),
            v(Quantity::Time, p.end_time_s - p.start_time_s, 4),
            if p.open { ", reaching the first or last sample (it may go on)" } else { "" }
        );
    }
    if report.directed {
        text += &match &s.max_q_alpha {
            Some(e) => format!(
                "max {}: {} {}, {}\n",
                qa.symbol,
                v(Quantity::QAlpha, e.value, 1),
                at(e.time_s, e.altitude_m),
                mach(e.mach)
            ),
            None => format!("max {}: none\n", qa.symbol),
        };
    }
    text += &match &s.max_mach {
        Some(m) => format!("max Mach: {} {}\n", fixed(m.value, 4), at(m.time_s, m.altitude_m)),
        None => "max Mach: none (no speed of sound at any sample)\n".to_owned(),
    };
    for (name, crossings) in [("up", &s.mach_one_up), ("down", &s.mach_one_down)] {
        text += &match (crossings.first_time_s, crossings.last_time_s) {
            (Some(first), Some(last)) => format!(
                "Mach 1 {name}: {} crossing(s), first at {}, last at {}\n",
                crossings.count,
                time(first),
                time(last)
            ),
            _ => format!("Mach 1 {name}: none\n"),
        };
    }
    if s.mach_undefined_samples > 0 {
        text += &format!(
            "Mach undefined at {} sample(s) above 86 km (no speed of sound there): a Mach 1 crossing among them \
             cannot be seen\n",
            s.mach_undefined_samples
        );
    }
    text += &match &s.max_drag {
        Some(d) => {
            format!("max {}: {} {}\n", drag.label, v(Quantity::Drag, d.value, 2), at(d.time_s, d.altitude_m))
        }
        None => format!("max {}: none (give --cd or --cd-table and --area)\n", drag.label),
    };
    if report.winds {
        text += &format!("wind held beyond the profile's ends at {} sample(s)\n", s.wind_held_samples);
    }
    for exceeded in &report.limits {
        let (info, limit) = (exceeded.quantity.info(), v(exceeded.quantity, exceeded.limit, 1));
        if exceeded.intervals.is_empty() {
            text += &format!("{} limit {limit}: not exceeded\n", info.symbol);
        }
        for e in &exceeded.intervals {
            let open = match (e.open_start, e.open_end) {
                (true, true) => " (above it from the first sample to the last)",
                (true, false) => " (above it from the first sample)",
                (false, true) => " (still above it at the last sample)",
                (false, false) => "",
            };
            text += &format!(
                "{} above {limit}: {} to {}, peak {} at {}{open}\n",
                info.symbol,
                time(e.start_time_s),
                v(Quantity::Time, e.end_time_s, 4),
                v(exceeded.quantity, e.peak, 1),
                time(e.peak_time_s)
            );
        }
    }
    text
}

/// The summaries as one JSON object: for one model the core's summary (in SI, or in US
/// units with each key renamed to its US column), the limits, the plateau and the caution;
/// for several, `models` (each of those without the caution) and `worst_case`.
pub fn json(reports: &[Report], units: UnitSystem) -> Value {
    let mut value = match reports {
        [one] => one_json(one, units),
        several => {
            let worst: Vec<Value> = worst(several)
                .into_iter()
                .map(|(q, report, v)| json!({"quantity": q.name(), units.column(q): units.from_si(q, v), "model": report.label}))
                .collect();
            json!({
                "models": several.iter().map(|r| one_json(r, units)).collect::<Vec<_>>(),
                "worst_case": worst,
            })
        }
    };
    if let Value::Object(map) = &mut value {
        if units == UnitSystem::Us {
            map.insert("units".to_owned(), json!("us"));
        }
        map.insert("caution".to_owned(), json!(CAUTION));
    }
    value
}

fn one_json(report: &Report, units: UnitSystem) -> Value {
    let mut value = serde_json::to_value(report.summary).unwrap_or(Value::Null);
    let Value::Object(map) = &mut value else { return value };
    if units == UnitSystem::Us {
        for (key, item) in map.iter_mut() {
            if let Value::Object(fields) = item {
                let extreme = key.strip_prefix("max_").and_then(Quantity::from_name);
                *fields = convert(std::mem::take(fields), extreme, units);
            }
        }
    }
    let of = |q: Quantity, si: f64| json!({ units.column(q): units.from_si(q, si) });
    map.insert("model".to_owned(), json!(report.label));
    for exceeded in &report.limits {
        let q = exceeded.quantity;
        // The loads review's names: `q_limit_exceedances` with `peak_pa` (`peak_psf`),
        // `q_alpha_limit_exceedances` with `peak_pa_deg` (`peak_psf_deg`).
        let short = if q == Quantity::DynamicPressure { "q" } else { q.name() };
        let column = units.column(q);
        let unit = column.strip_prefix(q.name()).unwrap_or(&column).trim_start_matches('_').to_lowercase();
        let peak_key = format!("peak_{unit}");
        let intervals: Vec<Value> = exceeded
            .intervals
            .iter()
            .map(|e| {
                let mut interval = serde_json::Map::new();
                interval.insert("start_time_s".to_owned(), json!(e.start_time_s));
                interval.insert("end_time_s".to_owned(), json!(e.end_time_s));
                interval.insert(peak_key.clone(), json!(units.from_si(q, e.peak)));
                interval.insert("peak_time_s".to_owned(), json!(e.peak_time_s));
                interval.insert("open_start".to_owned(), json!(e.open_start));
                interval.insert("open_end".to_owned(), json!(e.open_end));
                Value::Object(interval)
            })
            .collect();
        map.insert(format!("{short}_limit"), of(q, exceeded.limit));
        map.insert(format!("{short}_limit_exceedances"), Value::Array(intervals));
    }
    if let Some(p) = &report.plateau {
        map.insert(
            "q_plateau".to_owned(),
            json!({
                "start_time_s": p.start_time_s,
                "end_time_s": p.end_time_s,
                "maximum": of(Quantity::DynamicPressure, p.maximum),
                "fraction": p.fraction,
                "open": p.open,
            }),
        );
    }
    value
}

/// The quantity whose SI column a field of the core's summary is (`altitude_m`,
/// `dynamic_pressure_pa`): the core spells its fields in lower case. The peak's
/// `sample_max_pa` and `uncertainty_pa` are dynamic pressures.
fn si_quantity(key: &str) -> Option<Quantity> {
    if key.ends_with("_pa") {
        return Some(Quantity::DynamicPressure);
    }
    Quantity::ALL.iter().copied().find(|q| key.eq_ignore_ascii_case(&column(*q, q.si())))
}

/// `fields` (in SI) in `units`, in their order: a field of a quantity under its column in
/// `units` (a peak's `sample_max_pa` as `sample_max_psf`), an extreme's `value` under its
/// quantity's column when it has a unit.
fn convert(fields: Map<String, Value>, extreme: Option<Quantity>, units: UnitSystem) -> Map<String, Value> {
    fields
        .into_iter()
        .map(|(key, value)| {
            let quantity = match extreme {
                Some(q) if key == "value" && !units.unit(q).symbol().is_empty() => Some(q),
                _ => si_quantity(&key),
            };
            match quantity {
                Some(q) => {
                    let converted = value.as_f64().map_or(Value::Null, |v| json!(units.from_si(q, v)));
                    let renamed = match key.strip_suffix("_pa") {
                        Some(stem) if !key.eq_ignore_ascii_case(&column(q, q.si())) => {
                            format!("{stem}_{}", units.unit(q).symbol())
                        }
                        _ => units.column(q),
                    };
                    (renamed, converted)
                }
                None => (key, value),
            }
        })
        .collect()
}
