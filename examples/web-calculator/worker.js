// The page's worker: reads uploaded and pasted files through the module's own readers
// (readFlightCsv, AtmosphereModel.fromSoundingCsv) and does the long work off the page's
// thread (a sounding's model and its points, a flight's scan, the chart's thinning), so
// that no file, however long or malformed, freezes the page. The page restarts a worker
// whose work has been overtaken by new input.
//
// Messages in: {id, job: "sounding" | "point" | "flight", ...}; out: {id, ok: true, ...}
// or {id, ok: false, field, message}, `field` naming the page's field at fault.

import init, * as api from "./aerostrata/aerostrata.js";
import { computePoint, reachesUpper, UPPER_BASE_M } from "./point.js";
import { largest, thin } from "./thin.js";

// The default module and the full one (the readers, the user models and the scan).
const ready = init().then(() => api.loadFull());

/** The sounding last read, kept for the points and flights that follow: {version, model}. */
let sounding = null;

const textOf = async (source) => (typeof source === "string" ? source : await source.text());
const failure = (field, e) => ({ ok: false, field, message: e instanceof Error ? e.message : String(e) });

/** The model of sounding `described` ({version, source, units}), read once per version. */
async function soundingModel(described) {
  if (sounding?.version !== described.version) {
    sounding?.model.free();
    sounding = null;
    const model = api.AtmosphereModel.fromSoundingCsv(await textOf(described.source), described.units);
    sounding = { version: described.version, model };
  }
  return sounding.model;
}

/** The first line of `text` that is neither blank nor a comment, or null. */
function firstDataLine(text) {
  let start = 0;
  while (start < text.length) {
    let end = text.indexOf("\n", start);
    if (end < 0) end = text.length;
    const line = text.slice(start, end).trim();
    if (line !== "" && !line.startsWith("#")) return line;
    start = end + 1;
  }
  return null;
}

/**
 * The samples of a flight file. readFlightCsv needs a header; the command line also
 * reads a file without one (time, altitude and velocity in that order, in the chosen
 * units), and so does the page: such a file is read with the header
 * "time,altitude,velocity" put before it, and its messages' line numbers put back.
 */
function readFlight(text, units) {
  const first = firstDataLine(text);
  if (first === null || !/^"?\s*[+-]?(\d|\.\d)/.test(first)) return api.readFlightCsv(text, units);
  try {
    return api.readFlightCsv(`time,altitude,velocity\n${text}`, units);
  } catch (e) {
    throw new Error(e.message.replace(/^line (\d+)/, (_, n) => `line ${Number(n) - 1}`));
  }
}

async function sound({ described }) {
  try {
    const model = await soundingModel(described);
    return { ok: true, range: model.range() };
  } catch (e) {
    return failure("sounding-file", e);
  }
}

async function point({ described, inputs }) {
  let model;
  try {
    model = await soundingModel(described);
  } catch (e) {
    return failure("sounding-file", e);
  }
  const loadError = reachesUpper(inputs.altitudeM) ? await upperLoaded() : null;
  const result = computePoint(api, model, inputs);
  // Without the tables, a point that needed them says why they are missing.
  return loadError && !result.ok && /loadUpper/.test(result.message) ? failure("altitude", loadError) : result;
}

/** Whether the samples give the velocity's direction (components, or a path and heading). */
const hasDirection = (samples) => samples.velocityEastMS !== undefined || samples.headingDeg !== undefined;

/**
 * The field a scan's message belongs to: the vehicle's, the wind's, the limit's, or the
 * flight's own.
 */
function scanField(message) {
  if (/drag coefficient/.test(message)) return "flight-cd";
  if (/reference area/.test(message)) return "flight-area";
  if (/^winds?\b|wind speed/.test(message)) return "flight-wind-speed";
  if (/wind direction/.test(message)) return "flight-wind-direction";
  if (/qLimitPa/.test(message)) return "flight-q-limit";
  return "flight";
}

/**
 * Loads the upper atmosphere's tables (once; the module keeps them): null when they are
 * there, else the Error that says why they could not be fetched.
 */
async function upperLoaded() {
  try {
    await api.loadUpper();
    return null;
  } catch (e) {
    return new Error(`the upper atmosphere's tables (above 86 km) could not be loaded: ${e.message}`);
  }
}

/** The largest of `values` (Infinity when there are none: the scan then says why). */
function highest(values) {
  if (!values || values.length === 0) return Infinity;
  let top = -Infinity;
  for (const v of values) top = Math.max(top, v);
  return top;
}

async function flight({ source, units, model: described, cd, areaM2, wind, windsFile, qLimitPa, columns }) {
  let samples;
  try {
    samples = readFlight(await textOf(source), units);
  } catch (e) {
    return failure("flight", e);
  }
  const { ignored, ...given } = samples;
  const directed = hasDirection(given);
  if ((wind || windsFile) && !directed) {
    return failure(
      windsFile ? "flight-winds-file" : "flight-wind-speed",
      new Error("a wind needs the velocity's direction: the file gives only the speed; give velocity_east, velocity_north and velocity_up, or velocity with flight_path_angle and heading, or clear the wind"),
    );
  }
  let model;
  let owned = false;
  try {
    if (described.spec !== undefined) {
      model = api.AtmosphereModel.fromSpec(described.spec);
      owned = true;
    } else {
      model = await soundingModel(described.sounding);
    }
  } catch (e) {
    return failure(described.spec !== undefined ? "model-kind" : "sounding-file", e);
  }
  // One options object for every file: the speed form gives exactly the positional
  // call's numbers (the module's own test), and the limit applies to both.
  const options = { ...given, vehicle: { drag: cd, referenceAreaM2: areaM2 } };
  // A wind the same at every altitude: one level, held above and below it; or the file's
  // winds, read as the command line reads `--winds` (headings without a unit in the
  // flight's units).
  if (wind) options.winds = { altitudeM: [0], windSpeedMS: [wind.speedMS], windDirectionDeg: [wind.directionDeg] };
  let winds = null;
  if (windsFile) {
    try {
      winds = api.WindProfile.fromCsv(await textOf(windsFile), units);
    } catch (e) {
      if (owned) model.free();
      return failure("flight-winds-file", e);
    }
    options.winds = winds;
  }
  if (qLimitPa !== null && qLimitPa !== undefined) options.qLimitPa = qLimitPa;
  // A flight that climbs above 86 km (its altitudes are geometric) needs the upper
  // atmosphere's tables, fetched on first need.
  const loadError = highest(given.altitudeM) > UPPER_BASE_M ? await upperLoaded() : null;
  let scan;
  try {
    scan = model.scanFlight(options);
  } catch (e) {
    // Without the tables, a flight that needed them says why they are missing.
    if (loadError && /loadUpper/.test(e.message)) return failure("flight", loadError);
    return failure(scanField(e.message), e);
  } finally {
    if (owned) model.free();
    winds?.free();
  }
  const { points, summary } = scan;
  const times = points.timeS;
  const qAlpha = points.qAlphaPaDeg;
  return {
    ok: true,
    summary,
    ignored,
    directed,
    chart: {
      t0: times[0],
      t1: times[times.length - 1],
      q: thin(times, points.dynamicPressurePa, columns),
      mach: thin(times, points.mach, columns),
      qAlpha: qAlpha ? thin(times, qAlpha, columns) : null,
      highestQ: largest(points.dynamicPressurePa),
      highestMach: largest(points.mach),
      highestQAlpha: qAlpha ? largest(qAlpha) : null,
    },
  };
}

const JOBS = { sounding: sound, point, flight };

// One job at a time, in the order sent (a point waits for the sounding before it).
let queue = ready;
self.onmessage = ({ data }) => {
  queue = queue
    .then(() => JOBS[data.job](data))
    .catch((e) => failure(data.job === "flight" ? "flight" : "sounding-file", e))
    .then((answer) => {
      const series = answer.chart ? [answer.chart.q, answer.chart.mach, answer.chart.qAlpha].filter(Boolean) : [];
      const transfer = series.flatMap((s) => [s.times.buffer, s.values.buffer]);
      self.postMessage({ id: data.id, ...answer }, transfer);
    });
};
