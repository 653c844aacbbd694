// Stratacalc: a static page over the aerostrata WebAssembly module (the web build of
// the npm package, served beside this file as ./aerostrata/). Every number shown comes
// from the module, and so does every quantity's name, label and unit (its catalogue,
// `quantities()`); this file only reads the inputs, converts units at the edges with the
// module's own conversions (`toUs`, `fromUs`) and draws.

import init, {
  AtmosphereModel,
  dragN,
  dynamicPressureFromMachPa,
  dynamicPressurePa,
  fromUs,
  machNumber,
  quantities,
  reynoldsNumber,
  toUs,
  velocityFromMachMS,
} from "./aerostrata/aerostrata.js";

await init();

const $ = (id) => document.getElementById(id);

/** The module's catalogue of quantities, by machine name. */
const CATALOGUE = new Map(quantities().map((q) => [q.name, q]));
const quantity = (name) => CATALOGUE.get(name);

// --- units ---------------------------------------------------------------------------

/** The current unit system: "si" or "us". */
const units = () => document.querySelector('input[name="units"]:checked').value;

/** A unit symbol as the catalogue writes it ("kg/m3", "Pa s"), set for reading ("kg/m³", "Pa·s"). */
function pretty(symbol) {
  const superscript = { 2: "²", 3: "³" };
  return symbol.replace(/([a-zA-Z])([23])\b/g, (_, letter, digit) => letter + superscript[digit]).replace(/ /g, "·");
}

/** The unit quantity `name` is shown in, in the current unit system. */
const unitOf = (name) => pretty(units() === "us" ? quantity(name).usUnit : quantity(name).siUnit);

/** An SI value of quantity `name` in the current unit system, and back. */
const shownValue = (name, si) => (units() === "us" ? toUs(name, si) : si);
const siValue = (name, shown) => (units() === "us" ? fromUs(name, shown) : shown);

/** A catalogue label as a heading: its first letter capitalised. */
const heading = (name) => {
  const label = quantity(name).label;
  return label.charAt(0).toUpperCase() + label.slice(1);
};

/** A value for display: six significant digits, exponent form when very large or small. */
function show(value) {
  if (value === 0) return "0";
  const a = Math.abs(value);
  if (a >= 1e7 || a < 1e-3) return value.toExponential(4).replace("e+", "e");
  return String(Number(value.toPrecision(6)));
}

// --- result lists ------------------------------------------------------------------

/**
 * Fills a <dl> with rows [key, quantity name, SI value or null, note, label]: the label
 * (the catalogue's unless given), the value shown in the current units, the full SI value
 * in `data-value` (for tests and copying).
 */
function fill(dl, rows) {
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
    } else {
      dd.textContent = show(shownValue(name, value));
      dd.dataset.value = String(value);
      u.textContent = unitOf(name);
    }
    dl.append(dt, dd, u);
  }
}

/** The rows of every quantity of a catalogue group, read from a result object by key. */
const groupRows = (group, result, note) =>
  [...CATALOGUE.values()].filter((q) => q.group === group).map((q) => [q.key, q.name, result[q.key], note]);

// --- reading inputs ------------------------------------------------------------------

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** The number in input `id`, or a message for its field. */
function read(id) {
  const text = $(id).value.trim();
  if (text === "") return { error: "Enter a number." };
  if (!NUMBER.test(text)) return { error: `“${text}” is not a number.` };
  return { value: Number(text) };
}

function setMessage(id, message) {
  const input = $(id);
  const msg = $(`${id}-msg`);
  if (msg) msg.textContent = message ?? "";
  if (input) {
    if (message) input.setAttribute("aria-invalid", "true");
    else input.removeAttribute("aria-invalid");
  }
}

/** Runs `fn`; a thrown module error becomes the message of field `id`. */
function attempt(id, fn) {
  try {
    return { value: fn() };
  } catch (e) {
    setMessage(id, e.message);
    return { error: e.message };
  }
}

// --- the point view --------------------------------------------------------------------

let lastModel = null;

function modelFor(offsetK) {
  if (lastModel && lastModel.offsetK === offsetK) return lastModel.model;
  lastModel?.model.free();
  lastModel = { offsetK, model: AtmosphereModel.standard(offsetK) };
  return lastModel.model;
}

function updatePoint() {
  const ids = ["altitude", "offset", "velocity", "mach", "cd", "area", "length"];
  ids.forEach((id) => setMessage(id, ""));
  const speedKind = document.querySelector('input[name="speed-kind"]:checked').value;
  const inputs = {};
  let bad = false;
  for (const id of ids) {
    if ((id === "mach" && speedKind !== "mach") || (id === "velocity" && speedKind !== "velocity")) continue;
    const r = read(id);
    if (r.error) {
      setMessage(id, r.error);
      bad = true;
    } else inputs[id] = r.value;
  }
  const results = document.querySelector("#view-point .results");
  if (bad) {
    results.classList.add("stale");
    return;
  }
  const altitudeM = $("altitude-unit").value === "ft" ? fromUs("geometric_altitude", inputs.altitude) : inputs.altitude;
  const offsetK = siValue("temperature_offset", inputs.offset);
  const lengthM = siValue("reference_length", inputs.length);
  const areaM2 = siValue("reference_area", inputs.area);

  const model = attempt("offset", () => modelFor(offsetK));
  if (model.error) return results.classList.add("stale");
  const state = attempt("altitude", () => model.value.state(altitudeM));
  if (state.error) return results.classList.add("stale");
  const s = state.value;
  const a = s.speedOfSoundMS;

  let velocity;
  let mach = null;
  let q;
  if (speedKind === "mach") {
    if (a === null) {
      setMessage("mach", "A Mach number needs a speed of sound, which the standard does not define above 86 km.");
      return results.classList.add("stale");
    }
    // q = gamma p M^2 / 2 and the true airspeed V = M a, both from the module.
    q = attempt("mach", () => dynamicPressureFromMachPa(s.pressurePa, inputs.mach));
    if (q.error) return results.classList.add("stale");
    const v = attempt("mach", () => velocityFromMachMS(inputs.mach, a));
    if (v.error) return results.classList.add("stale");
    velocity = v.value;
    mach = inputs.mach;
  } else {
    velocity = siValue("true_airspeed", inputs.velocity);
    q = attempt("velocity", () => dynamicPressurePa(s.densityKgM3, velocity));
    if (q.error) return results.classList.add("stale");
  }
  const speedField = speedKind === "mach" ? "mach" : "velocity";
  if (mach === null && a !== null) {
    const m = attempt(speedField, () => machNumber(velocity, a));
    if (m.error) return results.classList.add("stale");
    mach = m.value;
  }
  const drag = attempt("cd", () => dragN(q.value, inputs.cd, areaM2));
  if (drag.error) {
    // dragN names the quantity it refuses; put the message where it belongs.
    if (/area/.test(drag.error)) {
      setMessage("cd", "");
      setMessage("area", drag.error);
    }
    return results.classList.add("stale");
  }
  let reynolds = null;
  if (s.dynamicViscosityPaS !== null) {
    const re = attempt("length", () => reynoldsNumber(s.densityKgM3, velocity, lengthM, s.dynamicViscosityPaS));
    if (re.error) return results.classList.add("stale");
    reynolds = re.value;
  }
  results.classList.remove("stale");
  const above = "not defined above 86 km";
  const row = (name, value, note) => [quantity(name).key, name, value, note];
  fill($("loads"), [
    row("dynamic_pressure", q.value),
    row("drag", drag.value),
    row("mach", mach, above),
    row("reynolds_number", reynolds, above),
    [quantity("velocity").key, "true_airspeed", velocity],
  ]);
  fill($("state"), groupRows("state", s, above));
  drawProfile(model.value, s);
}

// --- the profile chart ---------------------------------------------------------------

const SVG = "http://www.w3.org/2000/svg";

function el(name, attributes, text) {
  const node = document.createElementNS(SVG, name);
  for (const [k, v] of Object.entries(attributes)) node.setAttribute(k, v);
  if (text !== undefined) node.textContent = text;
  return node;
}

function drawProfile(model, s) {
  const svg = $("profile");
  const title = svg.querySelector("title");
  svg.replaceChildren(title);
  const z = s.geometricAltitudeM;
  const top = Math.min(1e6, Math.max(20000, 1.3 * z));
  const bottom = Math.max(-5000, Math.min(0, z));
  const n = 241;
  const altitudes = Float64Array.from({ length: n }, (_, i) => bottom + ((top - bottom) * i) / (n - 1));
  const panels = [
    ["temperature", false, "#b4532a"],
    ["pressure", true, "#2f6f8f"],
    ["density", true, "#5b7d3a"],
  ].map(([name, log, colour]) => [quantity(name).key, name, log, colour]);
  const columns = model.batch(
    altitudes,
    panels.map(([key]) => key),
  );
  const [x0, width, gap, y0, height] = [70, 250, 30, 24, 290];
  const yOf = (alt) => y0 + height - ((alt - bottom) / (top - bottom)) * height;
  // The altitude axis, km (or thousand ft).
  const lengthLabel = unitOf("geometric_altitude");
  const shownTop = shownValue("geometric_altitude", top);
  const shownBottom = shownValue("geometric_altitude", bottom);
  const step = niceStep((shownTop - shownBottom) / 6);
  for (let t = Math.ceil(shownBottom / step) * step; t <= shownTop; t += step) {
    const y = yOf(siValue("geometric_altitude", t));
    svg.append(el("line", { x1: x0 - 4, x2: x0 + 3 * width + 2 * gap, y1: y, y2: y, class: "axis" }));
    svg.append(el("text", { x: x0 - 8, y: y + 4, "text-anchor": "end" }, show(t / 1000)));
  }
  const axisLabel = lengthLabel === "m" ? "altitude, km" : `altitude, thousand ${lengthLabel}`;
  svg.append(el("text", { x: 14, y: y0 + height / 2, transform: `rotate(-90 14 ${y0 + height / 2})`, "text-anchor": "middle" }, axisLabel));
  panels.forEach(([key, name, log, colour], i) => {
    const left = x0 + i * (width + gap);
    const values = columns[key];
    const f = log ? Math.log10 : (v) => v;
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of values) {
      lo = Math.min(lo, f(v));
      hi = Math.max(hi, f(v));
    }
    if (hi - lo < 1e-12) {
      lo -= 1;
      hi += 1;
    }
    const xOf = (v) => left + ((f(v) - lo) / (hi - lo)) * width;
    svg.append(el("rect", { x: left, y: y0, width, height, fill: "none", class: "axis" }));
    const points = Array.from(values, (v, j) => `${xOf(v).toFixed(1)},${yOf(altitudes[j]).toFixed(1)}`).join(" ");
    svg.append(el("polyline", { points, class: "curve", stroke: colour }));
    const title = `${heading(name)}${log ? " (log)" : ""}, ${unitOf(name)}`;
    svg.append(el("text", { x: left + width / 2, y: y0 - 8, "text-anchor": "middle" }, title));
    const lowValue = log ? 10 ** lo : lo;
    const highValue = log ? 10 ** hi : hi;
    svg.append(el("text", { x: left, y: y0 + height + 16 }, show(shownValue(name, lowValue))));
    svg.append(el("text", { x: left + width, y: y0 + height + 16, "text-anchor": "end" }, show(shownValue(name, highValue))));
    // The current point.
    const cx = xOf(s[key]);
    const cy = yOf(z);
    svg.append(el("line", { x1: left, x2: left + width, y1: cy, y2: cy, stroke: colour, "stroke-dasharray": "3 4", "stroke-width": 1 }));
    svg.append(el("circle", { cx, cy, r: 6, fill: colour, stroke: "#fff", "stroke-width": 2, "data-marker": key }));
  });
}

function niceStep(raw) {
  const p = 10 ** Math.floor(Math.log10(raw));
  for (const m of [1, 2, 5, 10]) if (m * p >= raw) return m * p;
  return 10 * p;
}

// --- the flight view -----------------------------------------------------------------

/** Samples from CSV text: [time, altitude, velocity] per line, or a message. */
function parseFlight(text) {
  const t = [];
  const z = [];
  const v = [];
  const lines = text.split(/\r?\n/);
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i].trim();
    if (line === "" || line.startsWith("#")) continue;
    const cells = line.split(/[,;\t]/).map((c) => c.trim());
    if (cells.length !== 3 || !cells.every((c) => NUMBER.test(c))) {
      if (t.length === 0 && !cells.some((c) => NUMBER.test(c))) continue; // a header line
      return { error: `Line ${i + 1}: expected three numbers (time, altitude, velocity), got “${line}”.` };
    }
    t.push(Number(cells[0]));
    z.push(Number(cells[1]));
    v.push(Number(cells[2]));
  }
  if (t.length < 2) return { error: "The flight needs at least two samples." };
  return { t, z, v };
}

function updateFlight() {
  ["flight-cd", "flight-area", "flight"].forEach((id) => setMessage(id, ""));
  const results = document.querySelector("#view-flight .results");
  const text = $("flight-csv").value;
  if (text.trim() === "") {
    fill($("flight-summary"), []);
    drawFlight(null);
    return;
  }
  const parsed = parseFlight(text);
  const cd = read("flight-cd");
  const area = read("flight-area");
  if (cd.error) setMessage("flight-cd", cd.error);
  if (area.error) setMessage("flight-area", area.error);
  if (parsed.error) setMessage("flight", parsed.error);
  if (parsed.error || cd.error || area.error) return results.classList.add("stale");
  const offset = read("offset");
  const offsetK = offset.error ? 0 : siValue("temperature_offset", offset.value);
  const feet = $("flight-altitude-unit").value === "ft";
  const z = Float64Array.from(parsed.z, (x) => (feet ? fromUs("altitude", x) : x));
  const v = Float64Array.from(parsed.v, (x) => (feet ? fromUs("velocity", x) : x));
  let scan;
  try {
    scan = modelFor(offsetK).scanFlight(parsed.t, z, v, {
      drag: cd.value,
      referenceAreaM2: siValue("reference_area", area.value),
    });
  } catch (e) {
    const field = /drag coefficient/.test(e.message) ? "flight-cd" : /reference area/.test(e.message) ? "flight-area" : "flight";
    setMessage(field, e.message);
    return results.classList.add("stale");
  }
  results.classList.remove("stale");
  const { summary } = scan;
  const peak = summary.maxDynamicPressure;
  fill($("flight-summary"), [
    ["maxDynamicPressurePa", "dynamic_pressure", peak.dynamicPressurePa, null, `Maximum ${quantity("dynamic_pressure").label}`],
    ["maxDynamicPressureTimeS", "time", peak.timeS, null, "… at time"],
    ["maxDynamicPressureAltitudeM", "altitude", peak.altitudeM, null, "… at altitude"],
    ["maxDynamicPressureMach", "mach", peak.mach, "not defined", "… at Mach"],
    ["maxMach", "mach", summary.maxMach?.value ?? null, "not defined", `Maximum ${quantity("mach").label}`],
    ["maxDragN", "drag", summary.maxDrag?.value ?? null, "no drag", `Maximum ${quantity("drag").label}`],
    ["machOneUp", "mach", summary.machOneUp.count, null, "Mach 1 crossings, up"],
    ["samples", "mach", summary.samples, null, "Samples"],
  ]);
  drawFlight(scan);
}

function drawFlight(scan) {
  const svg = $("flight-chart");
  const title = svg.querySelector("title");
  svg.replaceChildren(title);
  if (!scan) return;
  const { points, summary } = scan;
  const [x0, width, y0, height] = [80, 740, 24, 290];
  const times = points.timeS;
  const t0 = times[0];
  const t1 = times[times.length - 1];
  const xOf = (t) => x0 + ((t - t0) / (t1 - t0)) * width;
  const peak = summary.maxDynamicPressure;
  const qMax = Math.max(peak.dynamicPressurePa, 1e-9);
  const machs = Array.from(points.mach).filter((m) => !Number.isNaN(m));
  const machMax = Math.max(1e-9, ...machs);
  const yQ = (q) => y0 + height - (q / qMax) * height * 0.92;
  const yM = (m) => y0 + height - (m / machMax) * height * 0.92;
  svg.append(el("rect", { x: x0, y: y0, width, height, fill: "none", class: "axis" }));
  const pLabel = unitOf("dynamic_pressure");
  const pShown = (q) => show(shownValue("dynamic_pressure", q));
  svg.append(el("text", { x: x0 - 8, y: y0 + 10, "text-anchor": "end" }, pShown(qMax)));
  svg.append(el("text", { x: x0 - 8, y: y0 + height, "text-anchor": "end" }, "0"));
  svg.append(el("text", { x: 16, y: y0 + height / 2, transform: `rotate(-90 16 ${y0 + height / 2})`, "text-anchor": "middle" }, `dynamic pressure, ${pLabel}`));
  svg.append(el("text", { x: x0 + width + 8, y: y0 + 10 }, show(machMax)));
  svg.append(el("text", { x: x0 + width + 8, y: y0 + height / 2 }, "Mach"));
  // Legend.
  const lx = x0 + width - 190;
  svg.append(el("line", { x1: lx, x2: lx + 28, y1: y0 + 18, y2: y0 + 18, stroke: "#b4532a", "stroke-width": 2 }));
  svg.append(el("text", { x: lx + 34, y: y0 + 22 }, "dynamic pressure"));
  svg.append(el("line", { x1: lx, x2: lx + 28, y1: y0 + 36, y2: y0 + 36, stroke: "#2f6f8f", "stroke-width": 2, "stroke-dasharray": "6 4" }));
  svg.append(el("text", { x: lx + 34, y: y0 + 40 }, "Mach number"));
  svg.append(el("text", { x: x0, y: y0 + height + 16 }, `${show(t0)} s`));
  svg.append(el("text", { x: x0 + width, y: y0 + height + 16, "text-anchor": "end" }, `${show(t1)} s`));
  const line = (values, yOf) =>
    Array.from(values, (v, j) => (Number.isNaN(v) ? null : `${xOf(times[j]).toFixed(1)},${yOf(v).toFixed(1)}`))
      .filter((p) => p !== null)
      .join(" ");
  svg.append(el("polyline", { points: line(points.dynamicPressurePa, yQ), class: "curve", stroke: "#b4532a" }));
  svg.append(el("polyline", { points: line(points.mach, yM), class: "curve", stroke: "#2f6f8f", "stroke-dasharray": "6 4" }));
  const px = xOf(peak.timeS);
  const py = yQ(peak.dynamicPressurePa);
  svg.append(el("polygon", { points: `${px},${py - 8} ${px + 8},${py} ${px},${py + 8} ${px - 8},${py}`, fill: "#1c2430", "data-marker": "max-q" }));
  svg.append(
    el("text", { x: px + 12, y: py - 10 }, `max q ${pShown(peak.dynamicPressurePa)} ${pLabel} at ${show(peak.timeS)} s`),
  );
}

// --- wiring ----------------------------------------------------------------------------

function setUnitLabels() {
  for (const span of document.querySelectorAll("[data-unit]")) span.textContent = unitOf(span.dataset.unit);
}

function selectTab(tab) {
  for (const t of document.querySelectorAll('[role="tab"]')) {
    const selected = t === tab;
    t.setAttribute("aria-selected", String(selected));
    t.tabIndex = selected ? 0 : -1;
    $(t.getAttribute("aria-controls")).hidden = !selected;
  }
  tab.focus();
}

const tabs = [...document.querySelectorAll('[role="tab"]')];
for (const tab of tabs) {
  tab.addEventListener("click", () => selectTab(tab));
  tab.addEventListener("keydown", (e) => {
    const i = tabs.indexOf(tab);
    const next = { ArrowRight: i + 1, ArrowLeft: i - 1, Home: 0, End: tabs.length - 1 }[e.key];
    if (next !== undefined) {
      e.preventDefault();
      selectTab(tabs[(next + tabs.length) % tabs.length]);
    }
  });
}

$("point-form").addEventListener("input", updatePoint);
$("point-form").addEventListener("submit", (e) => e.preventDefault());
for (const radio of document.querySelectorAll('input[name="speed-kind"]')) {
  radio.addEventListener("change", () => {
    const mach = document.querySelector('input[name="speed-kind"]:checked').value === "mach";
    $("mach-field").hidden = !mach;
    $("velocity-field").hidden = mach;
    updatePoint();
  });
}
// Switching units converts the entered values, so that they keep their meaning: each
// field's quantity is named by its `data-unit` label.
const CONVERTED = ["offset", "velocity", "area", "length", "flight-area"];
let previousUnits = units();
for (const radio of document.querySelectorAll('input[name="units"]')) {
  radio.addEventListener("change", () => {
    const now = units();
    for (const id of CONVERTED) {
      const r = read(id);
      const name = document.querySelector(`label[for="${id}"] [data-unit]`)?.dataset.unit;
      if (r.error || name === undefined) continue;
      const si = previousUnits === "us" ? fromUs(name, r.value) : r.value;
      $(id).value = show(now === "us" ? toUs(name, si) : si);
    }
    previousUnits = now;
    setUnitLabels();
    updatePoint();
    updateFlight();
  });
}
for (const id of ["flight-csv", "flight-cd", "flight-area", "flight-altitude-unit"]) {
  $(id).addEventListener("input", updateFlight);
}
$("flight-file").addEventListener("change", async () => {
  const file = $("flight-file").files[0];
  if (file) {
    $("flight-csv").value = await file.text();
    updateFlight();
  }
});
$("flight-demo").addEventListener("click", async () => {
  const response = await fetch("demo-flight.csv");
  $("flight-csv").value = await response.text();
  $("flight-cd").value = "0.45";
  $("flight-area").value = String(shownValue("reference_area", 0.0064));
  updateFlight();
});

setUnitLabels();
updatePoint();
updateFlight();
document.body.dataset.ready = "true";
