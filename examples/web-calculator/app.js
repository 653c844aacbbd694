// Air and loads along a flight: a static page over the aerostrata WebAssembly module (the
// web build of the npm package, served beside this file as ./aerostrata/). Every number
// shown comes from the module, and so does every quantity's name, label and unit (its
// catalogue), every reading of a typed value (`parseValue`) or a file (the worker's
// readers) and every model (`AtmosphereModel.fromSpec`, `fromSoundingCsv`). This file
// holds the chosen model and the point view, and wires the page together.

import init, * as api from "./aerostrata/aerostrata.js";
import { drawProfile } from "./charts.js";
import { renderFlight, requestFlight, setupFlight } from "./flight.js";
import { Runner, sizeText, tooLarge } from "./jobs.js";
import { $, allQuantities, convertFields, fill, quantity, setFieldUnits, setMessage, show, shownValue, takeField, unitOf, units, pretty } from "./page.js";
import { computePoint, reachesUpper, UPPER_BASE_M } from "./point.js";

try {
  // The default module, then the full one: every field is read through `parseValue` and
  // every model through `fromSpec`, which only the full module has.
  await init();
  await api.loadFull();
} catch (e) {
  // Without the module the page has no numbers to give: say so rather than sit blank.
  $("page-msg").textContent = `The aerostrata module could not be loaded (${e.message}). Serve this folder over HTTP with aerostrata/ beside index.html, its lite/ and full/ folders within (cargo xtask wasm builds it).`;
  throw e;
}

// --- the model -------------------------------------------------------------------------

const MODEL_HELP = {
  standard: "U.S. Standard Atmosphere 1976, from −5 km to 1000 km.",
  offset: "Every temperature shifted by ΔT at the standard's pressure: density changes, pressure does not follow.",
  "hydrostatic-offset": "Every temperature shifted by ΔT and the pressure integrated through the warmer or colder air from p0 at sea level, so that pressure, density and altitude agree.",
  isothermal: "One temperature at every altitude, the pressure falling exponentially from its value at altitude 0.",
  exponential: "Density falling exponentially with altitude from ρ0, over the scale height, at one temperature.",
  sounding: "A measured or design-day table of levels, read as the command line reads it; altitudes outside its levels are refused.",
};
/** The fields of each model. */
const MODEL_FIELDS = ["offset", "p0", "iso-t", "iso-p0", "exp-rho0", "exp-h", "exp-t"];

const kind = () => $("model-kind").value;

/** A value for a model spec: the number in the unit it was read in ("15degF", "1013hPa"). */
const specValue = (r) => `${r.value}${r.unit}`;
const optional = (name, r) => (r.empty ? "" : `,${name}=${specValue(r)}`);

/** The spec the chosen model's fields write, or {error} (with messages beside the fields). */
function modelSpec() {
  for (const id of MODEL_FIELDS) if (!$(id).closest("[data-models]").dataset.models.split(" ").includes(kind())) setMessage(id, "");
  const take = (...ids) => {
    const read = ids.map(takeField);
    return read.some((r) => r.error) ? null : read;
  };
  let read;
  switch (kind()) {
    case "offset":
      return (read = take("offset")) ? { spec: `offset=${specValue(read[0])}` } : { error: "offset" };
    case "hydrostatic-offset":
      return (read = take("offset", "p0")) ? { spec: `hydrostatic-offset=${specValue(read[0])}${optional("p0", read[1])}` } : { error: "offset" };
    case "isothermal":
      return (read = take("iso-t", "iso-p0")) ? { spec: `isothermal=${specValue(read[0])}${optional("p0", read[1])}` } : { error: "isothermal" };
    case "exponential":
      return (read = take("exp-rho0", "exp-h", "exp-t"))
        ? { spec: `exponential=${specValue(read[0])},${specValue(read[1])}${read[2].empty ? "" : `,${specValue(read[2])}`}` }
        : { error: "exponential" };
    default:
      return { spec: "standard" };
  }
}

/** Which field a refused spec is about, by the value the module's message names. */
function specField(message) {
  const fields = [
    [/an offset DT/, "offset"],
    [/sea-level pressure p0/, "p0"],
    [/a pressure p0/, "iso-p0"],
    [/a density RHO0/, "exp-rho0"],
    [/a scale height/, "exp-h"],
    [/a temperature T/, kind() === "isothermal" ? "iso-t" : "exp-t"],
  ];
  return fields.find(([pattern]) => pattern.test(message))?.[1] ?? "model-kind";
}

let specCache = null;
/** The module's model of `spec` ({model} or {error}), kept while the spec stays the same. */
function specModel(spec) {
  if (specCache?.spec === spec) return specCache;
  try {
    const model = api.AtmosphereModel.fromSpec(spec);
    specCache?.model.free();
    specCache = { spec, model };
    return specCache;
  } catch (e) {
    setMessage(specField(e.message), e.message);
    return { error: e.message };
  }
}

/** The sounding read last: {version, source, units, range}; null while none is. */
let sounding = null;
let soundingVersion = 0;
const soundingRunner = new Runner();

/**
 * The chosen model as the worker takes it: {spec}, {sounding: {version, source,
 * units}}, or {error} when its fields do not make one (their messages beside them).
 */
function describeModel() {
  setMessage("model-kind", "");
  if (kind() === "sounding") {
    $("model-spec").textContent = sounding ? `sounding=${sounding.source.name}` : "sounding=(no file yet)";
    $("model-spec").classList.remove("none");
    if (sounding) return { sounding: { version: sounding.version, source: sounding.source, units: sounding.units } };
    const reading = document.body.dataset.sounding === "busy";
    if (!reading && !$("sounding-file-msg").textContent) setMessage("sounding-file", "Upload a sounding to use it.");
    return { error: reading ? "reading the sounding" : "no sounding" };
  }
  const written = modelSpec();
  const built = written.error ? written : specModel(written.spec);
  // A refused value leaves no model: the last good spec must not stand beside it.
  $("model-spec").textContent = built.error ? "none until the value marked above is corrected" : written.spec;
  $("model-spec").classList.toggle("none", Boolean(built.error));
  return built.error ? { error: built.error } : { spec: written.spec };
}

function soundingStatus() {
  if (!sounding) return;
  const { geometricMinM, geometricMaxM } = sounding.range;
  const z = (m) => show(shownValue("geometric_altitude", m));
  $("sounding-status").textContent = `${sounding.source.name}: levels from ${z(geometricMinM)} to ${z(geometricMaxM)} ${pretty(unitOf("geometric_altitude"))}.`;
}

/** Reads an uploaded sounding in the worker (refusing one above the limit at once). */
async function loadSounding() {
  const file = $("sounding-file").files[0];
  if (!file) return;
  soundingRunner.restart();
  sounding = null;
  setMessage("sounding-file", "");
  const refusal = tooLarge(file);
  if (refusal) {
    setMessage("sounding-file", refusal);
    $("sounding-status").textContent = "";
    document.body.dataset.sounding = "failed";
    return updateAll();
  }
  const described = { version: ++soundingVersion, source: file, units: $("sounding-units").value };
  document.body.dataset.sounding = "busy";
  $("sounding-status").textContent = `Reading ${file.name} (${sizeText(file.size)})…`;
  updateAll();
  const answer = await soundingRunner.run({ job: "sounding", described });
  if (answer === null) return;
  if (!answer.ok) {
    setMessage("sounding-file", answer.message);
    $("sounding-status").textContent = "";
    document.body.dataset.sounding = "failed";
    return updateAll();
  }
  sounding = { ...described, range: answer.range };
  document.body.dataset.sounding = "done";
  soundingStatus();
  updateAll();
}

function showModelFields() {
  for (const box of document.querySelectorAll("[data-models]")) box.hidden = !box.dataset.models.split(" ").includes(kind());
  $("model-kind-help").textContent = MODEL_HELP[kind()];
}

// --- the point view --------------------------------------------------------------------

/** The last point drawn, kept for redrawing at another width or in other units. */
let lastPoint = null;
let pointRequest = 0;

function updatePoint() {
  const request = ++pointRequest;
  const speedKind = document.querySelector('input[name="speed-kind"]:checked').value;
  const speedField = speedKind === "mach" ? "mach" : "velocity";
  setMessage(speedKind === "mach" ? "velocity" : "mach", "");
  const ids = ["altitude", speedField, "cd", "area", "length"];
  const read = Object.fromEntries(ids.map((id) => [id, takeField(id)]));
  const model = describeModel();
  if (model.error || ids.some((id) => read[id].error)) return failedPoint();
  const inputs = {
    altitudeM: read.altitude.si,
    speedKind,
    velocityMS: read.velocity?.si,
    mach: read.mach?.si,
    cd: read.cd.si,
    areaM2: read.area.si,
    lengthM: read.length.si,
  };
  if (model.spec !== undefined) {
    if (api.upperLoaded() || !reachesUpper(inputs.altitudeM)) return showPoint(computePoint(api, specModel(model.spec).model, inputs));
    // The upper atmosphere's tables are fetched on first need. Up to 86 km the numbers
    // show at once (the profile chart follows); above, the point waits for them.
    if (inputs.altitudeM > UPPER_BASE_M) document.body.dataset.point = "busy";
    else showPoint(computePoint(api, specModel(model.spec).model, inputs));
    api.loadUpper().then(
      () => request === pointRequest && updatePoint(),
      (e) => {
        if (request !== pointRequest) return;
        // A model that does not need the tables still answers; the standard says why not.
        const result = computePoint(api, specModel(model.spec).model, inputs);
        if (result.ok || !/loadUpper/.test(result.message)) return showPoint(result);
        setMessage("altitude", `The upper atmosphere's tables (above 86 km) could not be loaded: ${e.message}`);
        failedPoint();
      },
    );
    return;
  }
  // A sounding's model lives in the worker: the point is computed there.
  document.body.dataset.point = "busy";
  soundingRunner.run({ job: "point", described: model.sounding, inputs }).then((answer) => {
    if (answer !== null && request === pointRequest) showPoint(answer);
  });
}

function failedPoint() {
  document.querySelector("#view-point .results").classList.add("stale");
  document.body.dataset.point = "failed";
}

function showPoint(result) {
  if (!result.ok) {
    setMessage(result.field ?? "altitude", result.message);
    return failedPoint();
  }
  lastPoint = result;
  renderPoint();
  document.querySelector("#view-point .results").classList.remove("stale");
  document.body.dataset.point = "done";
}

function renderPoint() {
  if (!lastPoint) return;
  const { state, loads, profile } = lastPoint;
  const above = "not defined here";
  const row = (name, value, note) => [quantity(name).key, name, value, note];
  fill($("loads"), [
    row("dynamic_pressure", loads.dynamicPressurePa),
    row("drag", loads.dragN),
    row("mach", loads.mach, above),
    row("reynolds_number", loads.reynoldsNumber, above),
    [quantity("velocity").key, "true_airspeed", loads.velocityMS],
  ]);
  const stateRows = allQuantities()
    .filter((q) => q.group === "state")
    .map((q) => [q.key, q.name, state[q.key], above]);
  fill($("state"), stateRows);
  drawProfile($("profile"), profile, state);
}

// --- wiring ----------------------------------------------------------------------------

function updateAll() {
  updatePoint();
  requestFlight();
}

function selectTab(tab) {
  for (const t of document.querySelectorAll('[role="tab"]')) {
    const selected = t === tab;
    t.setAttribute("aria-selected", String(selected));
    t.tabIndex = selected ? 0 : -1;
    $(t.getAttribute("aria-controls")).hidden = !selected;
  }
  tab.focus();
  renderPoint();
  renderFlight();
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
$("model-kind").addEventListener("change", () => {
  showModelFields();
  updateAll();
});
for (const id of MODEL_FIELDS) $(id).addEventListener("input", updateAll);
$("sounding-file").addEventListener("change", loadSounding);
$("sounding-units").addEventListener("change", loadSounding);

let previousUnits = units();
for (const radio of document.querySelectorAll('input[name="units"]')) {
  radio.addEventListener("change", () => {
    convertFields(previousUnits, units());
    previousUnits = units();
    setFieldUnits();
    soundingStatus();
    updatePoint();
    renderFlight();
  });
}

let resizing = 0;
window.addEventListener("resize", () => {
  cancelAnimationFrame(resizing);
  resizing = requestAnimationFrame(() => {
    renderPoint();
    renderFlight();
  });
});

$("model-grammar").textContent = api.modelGrammar();
setupFlight(describeModel);
showModelFields();
setFieldUnits();
updatePoint();
document.body.dataset.ready = "true";
