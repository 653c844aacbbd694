// The flight view: a pasted or uploaded flight file, read and scanned in the worker
// through the module (jobs.js, worker.js), its summary and its chart. An upload above
// the size limit is refused before it is read; anything else the worker answers while
// the page stays free, and a newer input overtakes an older one.

import { drawFlight, flightColumns } from "./charts.js";
import { Runner, sizeText, tooLarge } from "./jobs.js";
import { $, fill, quantity, setMessage, takeField } from "./page.js";

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

/** Reads the inputs and sends the flight to the worker; the answer is drawn when it comes. */
export async function requestFlight() {
  flightMessage("");
  const cd = takeField("flight-cd");
  const area = takeField("flight-area");
  if (source === null) {
    shown = null;
    renderFlight();
    status("empty");
    return;
  }
  const model = describeModel();
  if (cd.error || area.error || model.error) {
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

/** Draws the last flight (or nothing) in the current units. */
export function renderFlight() {
  const results = document.querySelector("#view-flight .results");
  if (!shown) {
    fill($("flight-summary"), []);
    drawFlight($("flight-chart"), null);
    return;
  }
  results.classList.remove("stale");
  const { summary } = shown;
  const peak = summary.maxDynamicPressure;
  const label = (name) => quantity(name).label;
  fill($("flight-summary"), [
    ["maxDynamicPressurePa", "dynamic_pressure", peak?.dynamicPressurePa ?? null, "none", `Maximum ${label("dynamic_pressure")}`],
    ["maxDynamicPressureTimeS", "time", peak?.timeS ?? null, null, "… at time"],
    ["maxDynamicPressureAltitudeM", "altitude", peak?.altitudeM ?? null, null, "… at altitude"],
    ["maxDynamicPressureMach", "mach", peak?.mach ?? null, "not defined", "… at Mach"],
    ["maxMach", "mach", summary.maxMach?.value ?? null, "not defined", `Maximum ${label("mach")}`],
    ["maxDragN", "drag", summary.maxDrag?.value ?? null, "no drag", `Maximum ${label("drag")}`],
    ["machOneUp", null, summary.machOneUp.count, null, "Mach 1 crossings, up"],
    ["samples", null, summary.samples, null, "Samples"],
  ]);
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
  status("busy", "");
  clearTimeout(typing);
  typing = setTimeout(requestFlight, 150);
}

/** Wires the view; `model` describes the page's model for the worker. */
export function setupFlight(model) {
  describeModel = model;
  $("flight-file").addEventListener("change", upload);
  $("flight-csv").addEventListener("input", pasted);
  for (const id of ["flight-cd", "flight-area", "flight-units"]) $(id).addEventListener("input", requestFlight);
  $("flight-demo").addEventListener("click", async () => {
    const response = await fetch("demo-flight.csv");
    $("flight-csv").value = await response.text();
    $("flight-cd").value = "0.45";
    $("flight-area").value = "0.0064m2";
    pasted();
  });
  status("empty");
}
