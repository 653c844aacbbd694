//! The add-in's cell functions, made from the core's quantity catalogue: one per state
//! quantity (its machine name upper-cased after the prefix), a generic one by name, and
//! the few computed from an altitude, a pressure, an airspeed or a Mach number. The names
//! are stored in documents, so they follow the catalogue's stable machine names.

use aerostrata::quantity::Group;
use aerostrata::Quantity;

/// Every display name starts with this, so that none collides with a built-in function.
pub const PREFIX: &str = "STRATA_";

/// The caution every description carries.
pub const CAUTION: &str = "Not certified flight software; verify independently; local codes, range-safety \
                           rules and licensed engineering practice govern.";

/// How an argument reaches the add-in.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum ArgKind {
    /// The first argument: a number, a cell or a column (an array formula fills a column).
    Column,
    /// A number.
    Number,
    /// A quantity's machine name.
    Text,
    /// Optional: a temperature offset in K, or a model spec string.
    Model,
}

/// One argument.
#[derive(Debug, Clone)]
pub struct Arg {
    pub name: &'static str,
    pub description: String,
    pub kind: ArgKind,
}

/// What the add-in calls in the C library.
#[derive(Debug, Clone, PartialEq)]
pub enum Call {
    /// `aerostrata_xl_state(id, altitude, spec)`.
    State(u32),
    /// `aerostrata_xl_state` with the id of the quantity named by the second argument.
    StateByName,
    /// A function of the altitude, the further numbers and the model:
    /// `symbol(altitude, numbers..., spec)`.
    AtAltitude(&'static str),
    /// A function of numbers only: `symbol(first, numbers...)`.
    Numbers(&'static str),
    /// `aerostrata_xl_airspeed(given, wanted, speed, pressure altitude, temperature)`.
    Airspeed(u32, u32),
}

/// One cell function.
#[derive(Debug, Clone)]
pub struct Function {
    /// The name typed in a cell (`STRATA_DENSITY`).
    pub display: String,
    /// The method's name in the UNO interface (`strataDensity`); documents store it.
    pub method: String,
    /// The Function Wizard's line: what it gives, in which unit, and the caution.
    pub description: String,
    /// The unit of the result, as the catalogue writes it ("" for a pure number).
    pub unit: &'static str,
    pub args: Vec<Arg>,
    pub call: Call,
}

fn camel(words: &str) -> String {
    let mut out = String::from("strata");
    for word in words.split('_').filter(|w| !w.is_empty()) {
        let mut chars = word.chars();
        if let Some(first) = chars.next() {
            out.extend(first.to_uppercase());
            out.push_str(&chars.as_str().to_ascii_lowercase());
        }
    }
    out
}

fn unit_text(unit: &str) -> String {
    if unit.is_empty() {
        "none (a pure number)".to_owned()
    } else {
        unit.to_owned()
    }
}

fn altitude() -> Arg {
    Arg {
        name: "altitude",
        description:
            "Geometric altitude, m: a number, a cell or a column (as an array formula a column gives a \
                      column)."
                .to_owned(),
        kind: ArgKind::Column,
    }
}

fn model() -> Arg {
    Arg {
        name: "model",
        description: "Optional. A temperature offset, K (15 for a standard+15 day), or a model spec: \
                      \"offset=+15K\", \"hydrostatic-offset=+15K\", \"isothermal=250K\", \
                      \"exponential=1.225,8500m\". Empty: the U.S. Standard Atmosphere 1976."
            .to_owned(),
        kind: ArgKind::Model,
    }
}

fn number(name: &'static str, description: &str) -> Arg {
    Arg { name, description: description.to_owned(), kind: ArgKind::Number }
}

fn column(name: &'static str, description: &str) -> Arg {
    Arg {
        name,
        description: format!(
            "{description}: a number, a cell or a column (as an array formula a column gives a column)."
        ),
        kind: ArgKind::Column,
    }
}

fn function(name: &str, what: &str, unit: &'static str, args: Vec<Arg>, call: Call) -> Function {
    let description = format!("{what}. Unit: {}. {CAUTION}", unit_text(unit));
    Function {
        display: format!("{PREFIX}{}", name.to_ascii_uppercase()),
        method: camel(name),
        description,
        unit,
        args,
        call,
    }
}

fn capitalised(label: &str) -> String {
    let mut chars = label.chars();
    chars.next().map(|c| c.to_uppercase().chain(chars).collect()).unwrap_or_default()
}

/// Every cell function, in the order the documentation lists them.
pub fn all() -> Vec<Function> {
    let mut out = Vec::new();
    for q in Quantity::of_group(Group::State) {
        let info = q.info();
        let what = format!("{} at an altitude: {}", capitalised(info.label), info.description);
        out.push(function(
            info.name,
            &what,
            info.si.symbol(),
            vec![altitude(), model()],
            Call::State(info.id),
        ));
    }
    let quantity = Arg {
        name: "quantity",
        description: "The state quantity's machine name as text, e.g. \"speed_of_sound\" (see the add-in's \
                      documentation for the list)."
            .to_owned(),
        kind: ArgKind::Text,
    };
    out.push(function(
        "state",
        "Any state quantity at an altitude, by its machine name",
        "the quantity's SI unit",
        vec![altitude(), quantity, model()],
        Call::StateByName,
    ));
    let velocity = || number("velocity", "Speed relative to the air, m/s.");
    let label = |q: Quantity| capitalised(q.info().label);
    out.push(function(
        Quantity::Mach.name(),
        &format!("{} of a speed at an altitude, V / a", label(Quantity::Mach)),
        Quantity::Mach.si().symbol(),
        vec![altitude(), velocity(), model()],
        Call::AtAltitude("aerostrata_xl_mach_at"),
    ));
    out.push(function(
        Quantity::DynamicPressure.name(),
        &format!("{} of a speed at an altitude, rho V^2 / 2", label(Quantity::DynamicPressure)),
        Quantity::DynamicPressure.si().symbol(),
        vec![altitude(), velocity(), model()],
        Call::AtAltitude("aerostrata_xl_dynamic_pressure_at"),
    ));
    out.push(function(
        Quantity::Drag.name(),
        &format!("{} of a body at a speed and an altitude, q Cd A", label(Quantity::Drag)),
        Quantity::Drag.si().symbol(),
        vec![
            altitude(),
            velocity(),
            number("cd", "Drag coefficient, a pure number."),
            number("area", "Reference area of the drag coefficient, m2."),
            model(),
        ],
        Call::AtAltitude("aerostrata_xl_drag"),
    ));
    let pressure = || column("pressure", "Static pressure, Pa");
    out.push(function(
        Quantity::PressureAltitude.name(),
        &format!(
            "{} of a static pressure in the 1976 standard (geopotential)",
            label(Quantity::PressureAltitude)
        ),
        Quantity::PressureAltitude.si().symbol(),
        vec![pressure()],
        Call::Numbers("aerostrata_xl_pressure_altitude"),
    ));
    out.push(function(
        Quantity::DensityAltitude.name(),
        &format!("{} of a density in the 1976 standard (geopotential)", label(Quantity::DensityAltitude)),
        Quantity::DensityAltitude.si().symbol(),
        vec![column("density", "Air density, kg/m3")],
        Call::Numbers("aerostrata_xl_density_altitude"),
    ));
    out.push(function(
        Quantity::QnhAltitude.name(),
        &format!(
            "{}: what an altimeter set to the QNH reads at a static pressure",
            label(Quantity::QnhAltitude)
        ),
        Quantity::QnhAltitude.si().symbol(),
        vec![pressure(), number("qnh", "Altimeter setting (QNH), Pa (101325 for 1013.25 hPa).")],
        Call::Numbers("aerostrata_xl_qnh_altitude"),
    ));
    let speeds = [Quantity::CalibratedAirspeed, Quantity::EquivalentAirspeed, Quantity::TrueAirspeed];
    for given in speeds {
        for wanted in speeds.into_iter().filter(|w| *w != given) {
            let (g, w) = (given.info(), wanted.info());
            out.push(function(
                &format!("{}_to_{}", g.symbol, w.symbol),
                &format!(
                    "{} of a {} at a pressure altitude and air temperature",
                    capitalised(w.label),
                    g.label
                ),
                w.si.symbol(),
                vec![
                    column("speed", &format!("The {}, m/s", g.label)),
                    number("pressure_altitude", "Pressure altitude, m (geopotential)."),
                    number("temperature", "Outside air temperature, K."),
                ],
                Call::Airspeed(g.id, w.id),
            ));
        }
    }
    let mach = || column("mach", "Mach number");
    for (name, what, symbol) in [
        (
            "isentropic_pressure_ratio",
            "Isentropic static over total pressure p/p0 of air (gamma 1.4)",
            "aerostrata_xl_isentropic_pressure_ratio",
        ),
        (
            "isentropic_temperature_ratio",
            "Isentropic static over total temperature T/T0 of air",
            "aerostrata_xl_isentropic_temperature_ratio",
        ),
        (
            "isentropic_density_ratio",
            "Isentropic static over total density rho/rho0 of air",
            "aerostrata_xl_isentropic_density_ratio",
        ),
    ] {
        out.push(function(name, what, "", vec![mach()], Call::Numbers(symbol)));
    }
    let upstream = || column("mach", "Upstream Mach number, at least 1");
    for (name, what, symbol) in [
        ("shock_mach", "Downstream Mach number of a normal shock in air", "aerostrata_xl_normal_shock_mach"),
        (
            "shock_pressure_ratio",
            "Static pressure ratio p2/p1 across a normal shock in air",
            "aerostrata_xl_normal_shock_pressure_ratio",
        ),
        (
            "shock_density_ratio",
            "Density ratio rho2/rho1 across a normal shock in air",
            "aerostrata_xl_normal_shock_density_ratio",
        ),
        (
            "shock_temperature_ratio",
            "Static temperature ratio T2/T1 across a normal shock in air",
            "aerostrata_xl_normal_shock_temperature_ratio",
        ),
        (
            "shock_total_pressure_ratio",
            "Total pressure ratio p02/p01 across a normal shock in air",
            "aerostrata_xl_normal_shock_total_pressure_ratio",
        ),
    ] {
        out.push(function(name, what, "", vec![upstream()], Call::Numbers(symbol)));
    }
    out
}

/// The state quantities without a function of their own (empty when the add-in covers the
/// catalogue): what `cargo xtask addin --check` and the catalogue check fail on.
pub fn missing_state_quantities(functions: &[Function]) -> Vec<&'static str> {
    Quantity::of_group(Group::State)
        .filter(|q| !functions.iter().any(|f| f.call == Call::State(q.id())))
        .map(Quantity::name)
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_are_unique_prefixed_and_cover_the_state() {
        let functions = all();
        assert!(missing_state_quantities(&functions).is_empty());
        for (i, f) in functions.iter().enumerate() {
            assert!(f.display.starts_with(PREFIX), "{}", f.display);
            assert!(f.display.bytes().all(|b| b.is_ascii_uppercase() || b.is_ascii_digit() || b == b'_'));
            assert!(f.method.bytes().all(|b| b.is_ascii_alphanumeric()), "{}", f.method);
            assert!(f.description.contains(CAUTION));
            assert!(functions[i + 1..].iter().all(|g| g.display != f.display && g.method != f.method));
        }
        let density = functions.iter().find(|f| f.display == "STRATA_DENSITY").unwrap();
        assert_eq!(density.method, "strataDensity");
        assert!(density.description.contains("kg/m3"), "{}", density.description);
        assert!(functions.iter().any(|f| f.display == "STRATA_CAS_TO_TAS"));
    }
}
