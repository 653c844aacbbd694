// The flight view: a pasted or uploaded flight file, read and scanned in the worker
// through the module (jobs.js, worker.js), its summary and its chart. An upload above
// the size limit is refused before it is read; anything else the worker answers while
// the page stays free, and a newer input overtakes an older one.

import { drawFlight, flightColumns } from "./charts.js";
import { Runner, sizeText, tooLarge } from "./jobs.js";
import { $, fill, pretty, quantity, setMessage, show, shownValue, takeField, unitOf } from "./page.js";

const runner = new Runner();
/** Where the samples come from: {file} or {text}, or null. */
let source = null;
/** The last flight drawn (the worker's answer), kept for redrawing in other units. */
let shown = null;
/** The model of the flight, as the page describes it (app.js). */
let describeModel = () => ({ error: "no model" });

/** The page's state of the flight view, for people (the status line) and tests (body data). */
function status(state, text) {
  document.body.dataset.flight = state;
  $("flight-status").textContent = text ?? "";
}

/** A message beside the flight's input (the file or the pasted text), or none. */
function flightMessage(message, input = source?.file ? "flight-file" : "flight-csv") {
  setMessage("flight", message);
  for (const id of ["flight-file", "flight-csv"]) $(id).removeAttribute("aria-invalid");
  if (message) $(input).setAttribute("aria-invalid", "true");
}

function stale() {
  document.querySelector("#view-flight .results").classList.add("stale");
}

/**
 * The wind: `{wind: {speedMS, directionDeg}}` typed, `{windsFile}` uploaded,
 * `{wind: null}` when the fields and the file are blank, or `{error}` (its message beside
 * the field at fault) when one is bad or missing, or both ways are given.
 */
function readWind() {
  const speed = takeField("flight-wind-speed");
  const direction = takeField("flight-wind-direction");
  const windsFile = $("flight-winds-file").files[0];
  setMessage("flight-winds-file", "");
  if (speed.error || direction.error) return { error: true };
  if (windsFile) {
    const refusal = tooLarge(windsFile);
    if (refusal || !(speed.empty && direction.empty)) {
      setMessage("flight-winds-file", refusal ?? "Give the wind one way: clear the typed speed and direction, or the file.");
      return { error: true };
    }
    return { windsFile };
  }
  if (speed.empty && direction.empty) return { wind: null };
  if (direction.empty) {
    setMessage("flight-wind-direction", "Enter the direction the wind blows from (270 for a west wind), or clear the speed.");
    return { error: true };
  }
  if (speed.empty) {
    setMessage("flight-wind-speed", "Enter the wind's speed, or clear the direction.");
    return { error: true };
  }
  return { wind: { speedMS: speed.si, directionDeg: direction.si } };
}

/** Reads the inputs and sends the flight to the worker; the answer is drawn when it comes. */
export async function requestFlight() {
  flightMessage("");
  const cd = takeField("flight-cd");
  const area = takeField("flight-area");
  const wind = readWind();
  const qLimit = takeField("flight-q-limit");
  if (source === null) {
    shown = null;
    renderFlight();
    status("empty");
    return;
  }
  const model = describeModel();
  if (cd.error || area.error || wind.error || qLimit.error || model.error) {
    stale();
    const waiting = model.error === "reading the sounding" ? "Waiting for the sounding…" : "The atmosphere above needs a valid model first.";
    status("failed", model.error ? waiting : "");
    return;
  }
  if (runner.busy) runner.restart();
  const what = source.file ? `${source.file.name} (${sizeText(source.file.size)})` : "the pasted samples";
  status("busy", `Reading ${what}…`);
  stale();
  const answer = await runner.run({
    job: "flight",
    source: source.file ?? source.text,
    units: $("flight-units").value,
    model,
    cd: cd.si,
    areaM2: area.si,
    wind: wind.wind ?? null,
    windsFile: wind.windsFile ?? null,
    qLimitPa: qLimit.empty ? null : qLimit.si,
    columns: flightColumns($("flight-chart")),
  });
  if (answer === null) return; // overtaken by newer input
  if (!answer.ok) {
    if (answer.field && answer.field !== "flight" && $(answer.field)) setMessage(answer.field, answer.message);
    else flightMessage(answer.message);
    status("failed", "");
    return;
  }
  shown = answer;
  renderFlight();
  const ignored = answer.ignored.length > 0 ? `; columns kept out: ${answer.ignored.join(", ")}` : "";
  const count = answer.summary.samples;
  const samples = `${count.toLocaleString("en-US")} sample${count === 1 ? "" : "s"}`;
  status("done", `${source.file ? source.file.name : "Pasted samples"}: ${samples}${ignored}.`);
}

/** A time for a sentence: six significant digits and its unit. */
const seconds = (t) => `${show(t)} s`;
/** A dynamic pressure for a sentence, in the units shown. */
const pressure = (pa) => `${show(shownValue("dynamic_pressure", pa))} ${pretty(unitOf("dynamic_pressure"))}`;

/**
 * The line under the summary on how well the samples pin the maximum q down: resolved,
 * or the advice to resample at the spacing the module suggests, or why it cannot be
 * bounded (the largest sample is the first or the last).
 */
function resolution(peak) {
  const line = $("flight-resolution");
  if (!peak) {
    line.textContent = "";
    line.dataset.state = "";
  } else if (peak.resolved) {
    line.textContent = `Maximum q resolved: the samples pin it down to ± ${pressure(peak.uncertaintyPa)} (within 0.1 %).`;
    line.dataset.state = "resolved";
  } else if (peak.uncertaintyPa === null) {
    line.textContent = "The largest sample is the first or the last: the maximum q may lie outside the samples, so it is not bounded.";
    line.dataset.state = "open";
  } else {
    const spacing = peak.suggestedSpacingS === null ? "" : ` Resample the flight at ${seconds(peak.suggestedSpacingS)} or finer to resolve it.`;
    line.textContent = `Maximum q not resolved by the sampling: the peak may lie up to ${pressure(peak.uncertaintyPa)} from the estimate.${spacing}`;
    line.dataset.state = "resample";
  }
}

/** The intervals where q exceeds the limit typed, or the list hidden when there is none. */
function exceedances(list) {
  const box = $("flight-exceedances");
  const ul = $("flight-exceedance-list");
  ul.replaceChildren();
  box.hidden = !list;
  if (!list) return;
  if (list.length === 0) {
    const li = document.createElement("li");
    li.textContent = "None: q stays at or below the limit.";
    ul.append(li);
    return;
  }
  for (const e of list) {
    const li = document.createElement("li");
    const from = e.openStart ? `${seconds(e.startTimeS)} (above it from the first sample)` : seconds(e.startTimeS);
    const to = e.openEnd ? `${seconds(e.endTimeS)} (still above it at the last sample)` : seconds(e.endTimeS);
    li.textContent = `${from} to ${to}: peak ${pressure(e.peak)} at ${seconds(e.peakTimeS)}`;
    li.dataset.start = String(e.startTimeS);
    li.dataset.end = String(e.endTimeS);
    li.dataset.peak = String(e.peak);
    ul.append(li);
  }
}

/** Draws the last flight (or nothing) in the current units. */
export function renderFlight() {
  const results = document.querySelector("#view-flight .results");
  if (!shown) {
    fill($("flight-summary"), []);
    resolution(null);
    exceedances(null);
    drawFlight($("flight-chart"), null);
    return;
  }
  results.classList.remove("stale");
  const { summary } = shown;
  const peak = summary.maxDynamicPressure;
  const label = (name) => quantity(name).label;
  const rows = [
    ["maxDynamicPressurePa", "dynamic_pressure", peak?.dynamicPressurePa ?? null, "none", `Maximum ${label("dynamic_pressure")}`],
    ["maxDynamicPressureSampleMaxPa", "dynamic_pressure", peak?.sampleMaxPa ?? null, null, "… largest sample"],
    ["maxDynamicPressureUncertaintyPa", "dynamic_pressure", peak?.uncertaintyPa ?? null, "not bounded", "… uncertainty, ±"],
    ["maxDynamicPressureTimeS", "time", peak?.timeS ?? null, null, "… at time"],
    ["maxDynamicPressureAltitudeM", "altitude", peak?.altitudeM ?? null, null, "… at altitude"],
    ["maxDynamicPressureMach", "mach", peak?.mach ?? null, "not defined", "… at Mach"],
  ];
  const plateau = summary.qPlateau;
  if (plateau) {
    const within = `${show(plateau.fraction * 100)} %`;
    rows.push(
      ["qPlateauStartS", "time", plateau.startTimeS, null, `q within ${within} of its maximum, from`],
      ["qPlateauEndS", "time", plateau.endTimeS, null, "… until"],
    );
  }
  if (shown.directed) {
    const qa = summary.maxQAlpha;
    rows.push(
      ["maxQAlphaPaDeg", "q_alpha", qa?.value ?? null, "none", `Maximum ${label("q_alpha")}`],
      ["maxQAlphaTimeS", "time", qa?.timeS ?? null, null, "… at time"],
      ["maxQAlphaAltitudeM", "altitude", qa?.altitudeM ?? null, null, "… at altitude"],
      ["maxQAlphaMach", "mach", qa?.mach ?? null, "not defined", "… at Mach"],
    );
  }
  rows.push(
    ["maxMach", "mach", summary.maxMach?.value ?? null, "not defined", `Maximum ${label("mach")}`],
    ["maxDragN", "drag", summary.maxDrag?.value ?? null, "no drag", `Maximum ${label("drag")}`],
    ["machOneUp", null, summary.machOneUp.count, null, "Mach 1 crossings, up"],
    ["machUndefinedSamples", null, summary.machUndefinedSamples, null, "Samples without a Mach number (above 86 km)"],
    ["samples", null, summary.samples, null, "Samples"],
  );
  fill($("flight-summary"), rows);
  resolution(peak);
  exceedances(summary.qExceedances ?? null);
  drawFlight($("flight-chart"), shown);
}

/** Takes the samples from an uploaded file, refusing one above the limit at once. */
function upload() {
  const file = $("flight-file").files[0];
  if (!file) return;
  const refusal = tooLarge(file);
  if (refusal) {
    if (runner.busy) runner.restart();
    source = null;
    shown = null;
    renderFlight();
    flightMessage(refusal, "flight-file");
    status("failed", "");
    return;
  }
  source = { file };
  $("flight-csv").value = "";
  requestFlight();
}

let typing = 0;
/** Takes the pasted samples, a moment after the last keystroke. */
function pasted() {
  const text = $("flight-csv").value;
  source = text.trim() === "" ? null : { text };
  $("flight-file").value = "";
  // The answer to older input must not come in while this waits to be sent, standing as
  // the answer to what was typed.
  if (runner.busy) runner.restart();
  status("busy", "");
  clearTimeout(typing);
  typing = setTimeout(requestFlight, 150);
}

/** Wires the view; `model` describes the page's model for the worker. */
export function setupFlight(model) {
  describeModel = model;
  $("flight-file").addEventListener("change", upload);
  $("flight-csv").addEventListener("input", pasted);
  for (const id of ["flight-cd", "flight-area", "flight-units", "flight-wind-speed", "flight-wind-direction", "flight-q-limit"]) {
    $(id).addEventListener("input", requestFlight);
  }
  $("flight-winds-file").addEventListener("change", requestFlight);
  $("flight-demo").addEventListener("click", async () => {
    const response = await fetch("demo-flight.csv");
    $("flight-csv").value = await response.text();
    $("flight-cd").value = "0.45";
    $("flight-area").value = "0.0064m2";
    pasted();
  });
  status("empty");
}
