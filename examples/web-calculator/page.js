// What every part of the page shares: the module's catalogue of quantities (names,
// labels, units), the unit system shown, the fields a person types in and how they are
// read (through the module's `parseValue`, so a value means here what it means on the
// command line), and the lists of results. No unit rule lives here: conversions are the
// module's (`toUs`, `unitFactors`).

import { parseValue, quantities, toUs, unitFactors } from "./aerostrata/aerostrata.js";

export const $ = (id) => document.getElementById(id);

let catalogue = null;
/** The module's catalogue by machine name (read once, after the module's init). */
const entries = () => (catalogue ??= new Map(quantities().map((q) => [q.name, q])));
/** The catalogue entry of quantity `name`. */
export const quantity = (name) => entries().get(name);
/** Every catalogue entry. */
export const allQuantities = () => [...entries().values()];

/** The unit system shown: "si" or "us". */
export const units = () => document.querySelector('input[name="units"]:checked').value;

/** A unit symbol as the catalogue writes it ("kg/m3", "Pa s"), set for reading ("kg/m³", "Pa·s"). */
export function pretty(symbol) {
  const superscript = { 2: "²", 3: "³" };
  return symbol
    .replace(/([a-zA-Z])([23])\b/g, (_, letter, digit) => letter + superscript[digit])
    .replace(/ /g, "·")
    .replace(/\bdeg([CFR])\b/g, "°$1");
}

/** The catalogue's unit of quantity `name` in the unit system shown, and an SI value in it. */
export const unitOf = (name) => (units() === "us" ? quantity(name).usUnit : quantity(name).siUnit);
export const shownValue = (name, si) => (units() === "us" ? toUs(name, si) : si);

/** A catalogue label as a heading: its first letter capitalised. */
export function heading(name) {
  const label = quantity(name).label;
  return label.charAt(0).toUpperCase() + label.slice(1);
}

/** A value for display: six significant digits, exponent form when very large or small. */
export function show(value) {
  if (value === 0) return "0";
  const a = Math.abs(value);
  if (a >= 1e7 || a < 1e-3) return value.toExponential(4).replace("e+", "e");
  return String(Number(value.toPrecision(6)));
}

// --- fields ------------------------------------------------------------------------------

/**
 * The fields that take a value, by element id: the catalogue quantity each reads (which
 * gives its dimension and the module's plausibility check) and, where the page shows
 * another unit than the catalogue's, that unit per system. A bare number is in the
 * unit shown beside the field's name.
 */
const FIELDS = {
  altitude: { quantity: "geometric_altitude", unit: () => $("altitude-unit").value },
  offset: { quantity: "temperature_offset" },
  p0: { quantity: "altimeter_setting", si: "hPa", optional: true },
  "iso-t": { quantity: "temperature" },
  "iso-p0": { quantity: "static_pressure", si: "hPa", optional: true },
  "exp-rho0": { quantity: "density" },
  "exp-h": { quantity: "pressure_scale_height" },
  "exp-t": { quantity: "temperature", optional: true },
  velocity: { quantity: "true_airspeed" },
  mach: { quantity: "mach" },
  cd: { quantity: "drag_coefficient" },
  area: { quantity: "reference_area" },
  length: { quantity: "reference_length" },
  "flight-cd": { quantity: "drag_coefficient" },
  "flight-area": { quantity: "reference_area" },
  "flight-wind-speed": { quantity: "wind_speed", optional: true },
  "flight-wind-direction": { quantity: "wind_direction", optional: true },
  "flight-q-limit": { quantity: "dynamic_pressure", optional: true },
};

/** The ids of the fields whose unit follows the unit system. */
const systemFields = () => Object.keys(FIELDS).filter((id) => !FIELDS[id].unit && quantity(FIELDS[id].quantity).siUnit !== "");

/** The unit a bare number in field `id` is read in, under unit system `system`. */
export function fieldUnit(id, system = units()) {
  const f = FIELDS[id];
  if (f.unit) return f.unit();
  const q = quantity(f.quantity);
  return system === "us" ? q.usUnit : (f.si ?? q.siUnit);
}

/** SI value `si` of field `id`'s quantity in `unit` (one of the units the page shows). */
export function inUnit(id, si, unit) {
  const q = quantity(FIELDS[id].quantity);
  if (unit === q.siUnit) return si;
  if (unit === q.usUnit) return toUs(q.name, si);
  if (unit === "hPa") return si / unitFactors().hPaPa;
  throw new Error(`no conversion of ${q.name} to ${unit}`);
}

/**
 * Reads field `id` through the module under unit system `system`: `{si, value, unit,
 * explicit}`, `{empty: true}` for an optional field left blank, or `{error}` with the
 * module's message.
 */
export function readField(id, system = units()) {
  const text = $(id).value.trim();
  if (text === "" && FIELDS[id].optional) return { empty: true };
  if (text === "") return { error: "Enter a value." };
  try {
    return parseValue(text, FIELDS[id].quantity, fieldUnit(id, system) || undefined);
  } catch (e) {
    return { error: e.message };
  }
}

/** The message of field `id` (empty clears it), and its input marked invalid or not. */
export function setMessage(id, message) {
  const input = $(id);
  const msg = $(`${id}-msg`);
  if (msg) msg.textContent = message ?? "";
  if (input) {
    if (message) input.setAttribute("aria-invalid", "true");
    else input.removeAttribute("aria-invalid");
  }
}

/**
 * Reads field `id`, and puts its message or, for a value typed in another unit than
 * the one shown, what it was read as ("= 10668 m") beside it. Returns what `readField`
 * does.
 */
export function takeField(id) {
  const r = readField(id);
  setMessage(id, r.error);
  const note = $(`${id}-note`);
  if (note) {
    const shownUnit = fieldUnit(id);
    note.textContent = r.explicit && r.unit !== shownUnit ? `read as ${show(inUnit(id, r.si, shownUnit))} ${pretty(shownUnit)}` : "";
  }
  return r;
}

/** Writes the unit of every field beside its name. */
export function setFieldUnits() {
  for (const span of document.querySelectorAll("[data-field-unit]")) span.textContent = pretty(fieldUnit(span.dataset.fieldUnit));
}

/**
 * Switching unit system converts the bare numbers typed, so that they keep their
 * meaning; a value written with its unit stays as written.
 */
export function convertFields(from, to) {
  for (const id of systemFields()) {
    const r = readField(id, from);
    if (r.error || r.empty || r.explicit) continue;
    $(id).value = show(inUnit(id, r.si, fieldUnit(id, to)));
  }
}

// --- result lists ----------------------------------------------------------------------

/**
 * Fills a <dl> with rows [key, quantity name, SI value or null, note, label]: the label
 * (the catalogue's unless given), the value shown in the current units, the full SI value
 * in `data-value` (for tests and copying). A row whose quantity name is null is a count
 * (samples, crossings), written whole with its thousands grouped.
 */
export function fill(dl, rows) {
  dl.replaceChildren();
  for (const [key, name, value, note, label] of rows) {
    const dt = document.createElement("dt");
    dt.textContent = label ?? heading(name);
    const dd = document.createElement("dd");
    dd.dataset.quantity = key;
    const u = document.createElement("dd");
    u.className = "u";
    if (value === null || value === undefined) {
      dd.textContent = "—";
      dd.dataset.value = "";
      u.textContent = note ?? "";
    } else if (name === null) {
      dd.textContent = value.toLocaleString("en-US");
      dd.dataset.value = String(value);
    } else {
      dd.textContent = show(shownValue(name, value));
      dd.dataset.value = String(value);
      u.textContent = pretty(unitOf(name));
    }
    dl.append(dt, dd, u);
  }
}
