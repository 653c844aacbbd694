// Stratacalc: a static page over the aerostrata WebAssembly module (the web build of
// the npm package, served beside this file as ./aerostrata/). Every number shown comes
// from the module; this file only reads the inputs, converts units at the edges with
// the module's own exact factors (`unitFactors`) and draws.

import init, {
  AtmosphereModel,
  dragN,
  dynamicPressureFromMachPa,
  dynamicPressurePa,
  machNumber,
  reynoldsNumber,
  unitFactors,
  velocityFromMachMS,
} from "./aerostrata/aerostrata.js";

await init();

const U = unitFactors();
const $ = (id) => document.getElementById(id);

// --- units ---------------------------------------------------------------------------

/** The current unit system: "si" or "us". */
const units = () => document.querySelector('input[name="units"]:checked').value;

// Each display unit: its label and how many SI units one of it is (value_SI = value * factor).
const UNIT = {
  si: {
    temperature: ["K", 1],
    pressure: ["Pa", 1],
    density: ["kg/m³", 1],
    speed: ["m/s", 1],
    viscosity: ["Pa·s", 1],
    kinematic: ["m²/s", 1],
    conductivity: ["W/(m·K)", 1],
    acceleration: ["m/s²", 1],
    length: ["m", 1],
    numberDensity: ["1/m³", 1],
    frequency: ["Hz", 1],
    molar: ["kg/kmol", 1],
    force: ["N", 1],
    area: ["m²", 1],
    offset: ["K", 1],
    time: ["s", 1],
    ratio: ["", 1],
  },
  us: {
    temperature: ["°R", U.rankineK],
    pressure: ["lbf/ft²", U.psfPa],
    density: ["slug/ft³", U.slugPerFt3KgM3],
    speed: ["ft/s", U.footM],
    viscosity: ["lbf·s/ft²", U.psfPa],
    kinematic: ["ft²/s", U.footM * U.footM],
    conductivity: ["W/(m·K)", 1],
    acceleration: ["ft/s²", U.footM],
    length: ["ft", U.footM],
    numberDensity: ["1/ft³", 1 / (U.footM * U.footM * U.footM)],
    frequency: ["Hz", 1],
    molar: ["lb/lbmol", 1],
    force: ["lbf", U.poundForceN],
    area: ["ft²", U.footM * U.footM],
    // A temperature difference: one degree Fahrenheit is one rankine.
    offset: ["°F", U.rankineK],
    time: ["s", 1],
    ratio: ["", 1],
  },
};

const unitOf = (kind) => UNIT[units()][kind];

/** A value for display: six significant digits, exponent form when very large or small. */
function show(value) {
  if (value === 0) return "0";
  const a = Math.abs(value);
  if (a >= 1e7 || a < 1e-3) return value.toExponential(4).replace("e+", "e");
  return String(Number(value.toPrecision(6)));
}

// --- the state's quantities ----------------------------------------------------------

const STATE_ROWS = [
  ["geometricAltitudeM", "Geometric altitude", "length"],
  ["geopotentialAltitudeM", "Geopotential altitude", "length"],
  ["temperatureK", "Temperature", "temperature"],
  ["molecularTemperatureK", "Molecular-scale temperature", "temperature"],
  ["pressurePa", "Pressure", "pressure"],
  ["densityKgM3", "Density", "density"],
  ["speedOfSoundMS", "Speed of sound", "speed"],
  ["dynamicViscosityPaS", "Dynamic viscosity", "viscosity"],
  ["kinematicViscosityM2S", "Kinematic viscosity", "kinematic"],
  ["thermalConductivityWMK", "Thermal conductivity", "conductivity"],
  ["gravityMS2", "Gravity", "acceleration"],
  ["pressureScaleHeightM", "Pressure scale height", "length"],
  ["numberDensityM3", "Number density", "numberDensity"],
  ["meanParticleSpeedMS", "Mean particle speed", "speed"],
  ["meanFreePathM", "Mean free path", "length"],
  ["collisionFrequencyHz", "Collision frequency", "frequency"],
  ["meanMolarMassKgKmol", "Mean molar mass", "molar"],
  ["temperatureRatio", "Temperature ratio θ", "ratio"],
  ["pressureRatio", "Pressure ratio δ", "ratio"],
  ["densityRatio", "Density ratio σ", "ratio"],
];

/**
 * Fills a <dl> with rows [key, label, kind, SI value or null, note]: the shown value in
 * the current units, the full SI value in `data-value` (for tests and copying).
 */
function fill(dl, rows) {
  dl.replaceChildren();
  for (const [key, label, kind, value, note] of rows) {
    const dt = document.createElement("dt");
    dt.textContent = label;
    const dd = document.createElement("dd");
    dd.dataset.quantity = key;
    const u = document.createElement("dd");
    u.className = "u";
    if (value === null || value === undefined) {
      dd.textContent = "—";
      dd.dataset.value = "";
      u.textContent = note ?? "";
    } else {
      const [label, factor] = unitOf(kind);
      dd.textContent = show(value / factor);
      dd.dataset.value = String(value);
      u.textContent = label;
    }
    dl.append(dt, dd, u);
  }
}

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
  const altitudeM = inputs.altitude * ($("altitude-unit").value === "ft" ? U.footM : 1);
  const offsetK = inputs.offset * unitOf("offset")[1];
  const lengthM = inputs.length * unitOf("length")[1];
  const areaM2 = inputs.area * unitOf("area")[1];

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
    velocity = inputs.velocity * unitOf("speed")[1];
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
  fill($("loads"), [
    ["dynamicPressurePa", "Dynamic pressure q", "pressure", q.value],
    ["dragN", "Drag", "force", drag.value],
    ["mach", "Mach number", "ratio", mach, above],
    ["reynoldsNumber", "Reynolds number", "ratio", reynolds, above],
    ["velocityMS", "True airspeed", "speed", velocity],
  ]);
  fill(
    $("state"),
    STATE_ROWS.map(([key, label, kind]) => [key, label, kind, s[key], above]),
  );
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
  const columns = model.batch(altitudes, ["temperatureK", "pressurePa", "densityKgM3"]);
  const panels = [
    ["temperatureK", "Temperature", "temperature", false, "#b4532a"],
    ["pressurePa", "Pressure (log)", "pressure", true, "#2f6f8f"],
    ["densityKgM3", "Density (log)", "density", true, "#5b7d3a"],
  ];
  const [x0, width, gap, y0, height] = [70, 250, 30, 24, 290];
  const yOf = (alt) => y0 + height - ((alt - bottom) / (top - bottom)) * height;
  // The altitude axis, km (or thousand ft).
  const [lengthLabel, lengthFactor] = unitOf("length");
  const step = niceStep((top - bottom) / lengthFactor / 6);
  for (let t = Math.ceil(bottom / lengthFactor / step) * step; t <= top / lengthFactor; t += step) {
    const y = yOf(t * lengthFactor);
    svg.append(el("line", { x1: x0 - 4, x2: x0 + 3 * width + 2 * gap, y1: y, y2: y, class: "axis" }));
    svg.append(el("text", { x: x0 - 8, y: y + 4, "text-anchor": "end" }, show(t / 1000)));
  }
  const axisLabel = lengthLabel === "m" ? "altitude, km" : `altitude, thousand ${lengthLabel}`;
  svg.append(el("text", { x: 14, y: y0 + height / 2, transform: `rotate(-90 14 ${y0 + height / 2})`, "text-anchor": "middle" }, axisLabel));
  panels.forEach(([key, label, kind, log, colour], i) => {
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
    const [unitLabel, factor] = unitOf(kind);
    svg.append(el("text", { x: left + width / 2, y: y0 - 8, "text-anchor": "middle" }, `${label}, ${unitLabel}`));
    const lowValue = log ? 10 ** lo : lo;
    const highValue = log ? 10 ** hi : hi;
    svg.append(el("text", { x: left, y: y0 + height + 16 }, show(lowValue / factor)));
    svg.append(el("text", { x: left + width, y: y0 + height + 16, "text-anchor": "end" }, show(highValue / factor)));
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
  const offsetK = offset.error ? 0 : offset.value * unitOf("offset")[1];
  const factor = $("flight-altitude-unit").value === "ft" ? U.footM : 1;
  const z = Float64Array.from(parsed.z, (x) => x * factor);
  const v = Float64Array.from(parsed.v, (x) => x * factor);
  let scan;
  try {
    scan = modelFor(offsetK).scanFlight(parsed.t, z, v, {
      drag: cd.value,
      referenceAreaM2: area.value * unitOf("area")[1],
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
    ["maxDynamicPressurePa", "Maximum dynamic pressure", "pressure", peak.dynamicPressurePa],
    ["maxDynamicPressureTimeS", "… at time", "time", peak.timeS],
    ["maxDynamicPressureAltitudeM", "… at altitude", "length", peak.altitudeM],
    ["maxDynamicPressureMach", "… at Mach", "ratio", peak.mach, "not defined"],
    ["maxMach", "Maximum Mach number", "ratio", summary.maxMach?.value ?? null, "not defined"],
    ["maxDragN", "Maximum drag", "force", summary.maxDrag?.value ?? null, "no drag"],
    ["machOneUp", "Mach 1 crossings, up", "ratio", summary.machOneUp.count],
    ["samples", "Samples", "ratio", summary.samples],
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
  const [pLabel, pFactor] = unitOf("pressure");
  svg.append(el("text", { x: x0 - 8, y: y0 + 10, "text-anchor": "end" }, show(qMax / pFactor)));
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
    el("text", { x: px + 12, y: py - 10 }, `max q ${show(peak.dynamicPressurePa / pFactor)} ${pLabel} at ${show(peak.timeS)} s`),
  );
}

// --- wiring ----------------------------------------------------------------------------

function setUnitLabels() {
  for (const span of document.querySelectorAll("[data-unit]")) span.textContent = unitOf(span.dataset.unit)[0];
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
// Switching units converts the entered values, so that they keep their meaning.
const CONVERTED = [
  ["offset", "offset"],
  ["velocity", "speed"],
  ["area", "area"],
  ["length", "length"],
  ["flight-area", "area"],
];
let previousUnits = units();
for (const radio of document.querySelectorAll('input[name="units"]')) {
  radio.addEventListener("change", () => {
    const now = units();
    for (const [id, kind] of CONVERTED) {
      const r = read(id);
      if (!r.error) $(id).value = show((r.value * UNIT[previousUnits][kind][1]) / UNIT[now][kind][1]);
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
  $("flight-area").value = String(0.0064 / unitOf("area")[1]);
  updateFlight();
});

setUnitLabels();
updatePoint();
updateFlight();
document.body.dataset.ready = "true";
