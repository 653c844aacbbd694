// The web calculator (examples/web-calculator) in headless Chromium, driven by
// playwright-core: type values as a user does and read the results against the
// reference vectors (tests/vectors/usa76_lower.csv: U.S. Standard Atmosphere 1976, from
// memory of the printed table, each cell within half a unit of its last digit), enter bad
// values and read the messages beside their fields, choose each model and read the
// module's numbers, load flight files (in metres, in feet, with the velocity's direction
// through a typed crosswind, coarsely sampled, a million samples, random bytes, one above
// the upload limit) and read the maximum dynamic pressure, q-alpha, the resampling advice
// and the q-limit exceedances against the Node build of the same module. Saves screenshots at a desktop's and a phone's width.
// The times the page takes to answer are measured and printed, never asserted (a slow
// machine must not fail the test); what is asserted is that the answer comes, and what
// it says.
//
// Usage (cargo xtask browser-test does this): node calculator.test.mjs URL SHOTS_DIR VECTORS_DIR
// with URL the page served on 127.0.0.1. Prints "N passed, M failed"; exit status 1 on
// any failure.

import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";

import { chromium } from "playwright-core";

import { coarseCorner, inFeet, longFlight, noise, oversized, pathFlight, rowsOf, vectorFlight } from "./files.mjs";

const [url, shots, vectors] = process.argv.slice(2);
if (!url || !shots || !vectors) {
  console.error("usage: node calculator.test.mjs URL SHOTS_DIR VECTORS_DIR");
  process.exit(2);
}
const here = dirname(fileURLToPath(import.meta.url));
const root = resolve(here, "..", "..");
const require = createRequire(import.meta.url);
const { columnsOf, evaluator, halfUnitOfLastDigit, readVectorFile } = await import(join(root, "bindings/wasm/tests/vectors.mjs"));
const aerostrata = require(process.env.AEROSTRATA_PKG ?? join(root, "target/wasm/pkg"));
// The module's numbers above 86 km, to compare the page's with, need its upper part; the
// readers and user models its full part.
await aerostrata.loadUpper();
await aerostrata.loadFull();

let passed = 0;
const failures = [];
const timings = [];
function check(ok, what) {
  if (ok) passed++;
  else failures.push(what);
}

mkdirSync(shots, { recursive: true });
// Uploads are files on disk, so that handing them to the page costs the page nothing
// (a buffer given to setInputFiles is rebuilt inside the page, on its main thread, which
// would stall it for the test's sake and spoil the timings).
const uploads = mkdtempSync(join(tmpdir(), "calculator-uploads-"));
const upload = (name, content) => {
  const path = join(uploads, name);
  writeFileSync(path, content);
  return path;
};
const profile = mkdtempSync(join(tmpdir(), "calculator-chromium-"));
const context = await chromium.launchPersistentContext(profile, {
  executablePath: "/usr/bin/chromium",
  headless: true,
  viewport: { width: 1180, height: 1500 },
  args: [
    "--headless",
    "--no-sandbox",
    "--disable-gpu",
    "--disable-quic",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
  ],
});
const host = new URL(url).host;
// Nothing but the page's own server.
await context.route("**/*", (route) => (new URL(route.request().url()).host === host ? route.continue() : route.abort()));

try {
  const page = context.pages()[0] ?? (await context.newPage());
  const errors = [];
  page.on("pageerror", (e) => errors.push(e.message));
  page.on("console", (m) => m.type() === "error" && errors.push(m.text()));
  // Who fetches the upper atmosphere's tables, and when: the page or its worker.
  const upperFetches = [];
  context.on("request", (r) => r.url().endsWith("/aerostrata_upper.bin") && upperFetches.push(r.url()));
  // The page and its worker each load the package's two modules.
  const moduleFetches = [];
  context.on("request", (r) => r.url().endsWith("_bg.wasm") && moduleFetches.push(new URL(r.url()).pathname));
  await page.goto(url);
  await page.waitForSelector('body[data-ready="true"]', { timeout: 20000 });
  for (const file of ["/aerostrata/aerostrata_bg.wasm", "/aerostrata/full/aerostrata_bg.wasm"]) {
    check(moduleFetches.includes(file), `${file} fetched at start (${moduleFetches.join(", ")})`);
  }
  // The page opens at 11 000 m: nothing needs the upper atmosphere yet.
  check(upperFetches.length === 0, `the upper part is not fetched at start (${upperFetches.length} requests)`);

  const value = async (quantity) => {
    const text = await page.getAttribute(`#view-point [data-quantity="${quantity}"]`, "data-value");
    return text === null || text === "" ? null : Number(text);
  };
  const shown = (quantity) => page.textContent(`#view-point [data-quantity="${quantity}"]`);
  const message = (id) => page.textContent(`#${id}-msg`);

  // 1. Typed altitudes against the published vectors, every value column of each row.
  const file = readVectorFile(join(vectors, "usa76_lower.csv"));
  const rows = file.rows.filter(({ cells }) => ["0", "5000", "11000", "20000", "32000", "47000", "71000", "84000"].includes(cells[0]));
  check(rows.length >= 6, `only ${rows.length} vector rows found`);
  let compared = 0;
  for (const { cells } of rows) {
    await page.fill("#altitude", "");
    await page.type("#altitude", cells[0], { delay: 5 });
    for (const [i, column] of file.columns.entries()) {
      const written = cells[i + 1];
      if (written === "") continue;
      const ours = await value(columnsOf(aerostrata).get(column).key);
      const tolerance = halfUnitOfLastDigit(written);
      check(ours !== null && Math.abs(ours - Number(written)) <= tolerance, `${column} at ${cells[0]} m: page ${ours}, vector ${written}`);
      compared++;
    }
  }
  check(compared >= 30, `only ${compared} values compared with the vectors`);

  // 1b. The upper atmosphere is fetched on first need (the lower vectors above reach
  // 84 km, whose profile chart reaches above 86 km); then a typed altitude above 86 km
  // gives the module's numbers, and no message asks the user to load anything.
  await page.fill("#altitude", "150000");
  await page.waitForFunction(() => document.body.dataset.point === "done", null, { timeout: 60000 });
  check(upperFetches.length >= 1, `the upper part was fetched (${upperFetches.length} requests)`);
  const upperState = aerostrata.standardState(150000);
  for (const key of ["temperatureK", "pressurePa", "densityKgM3"]) {
    const ours = await value(key);
    check(Object.is(ours, upperState[key]), `${key} at 150 km: page ${ours}, module ${upperState[key]}`);
  }
  check((await message("altitude")) === "", `no message at 150 km: "${await message("altitude")}"`);

  // 2. The page's numbers are the module's: every state quantity at a typed altitude.
  await page.fill("#altitude", "25000");
  const native = aerostrata.standardState(25000);
  for (const [key, expected] of Object.entries(native)) {
    const ours = await value(key);
    check(Object.is(ours, expected), `${key} at 25 000 m: page ${ours}, module ${expected}`);
  }
  check((await shown("temperatureK")).trim() === String(Number(native.temperatureK.toPrecision(6))), "shown temperature rounded to 6 digits");

  // 3. Loads: q = rho V^2 / 2 and Mach from the module at 11 km, 250 m/s.
  await page.fill("#altitude", "11000");
  await page.fill("#velocity", "250");
  const s11 = aerostrata.standardState(11000);
  check(Object.is(await value("dynamicPressurePa"), aerostrata.dynamicPressurePa(s11.densityKgM3, 250)), "q at 11 km, 250 m/s");
  check(Object.is(await value("mach"), aerostrata.machNumber(250, s11.speedOfSoundMS)), "Mach at 11 km, 250 m/s");
  check(Object.is(await value("dragN"), aerostrata.dragN(aerostrata.dynamicPressurePa(s11.densityKgM3, 250), 0.45, 0.0182)), "drag at 11 km");

  // 4. Feet: 36 089 ft is 11 000.0 m (the international foot, 0.3048 m).
  await page.selectOption("#altitude-unit", "ft");
  await page.fill("#altitude", "36089.24");
  check(Math.abs((await value("geometricAltitudeM")) - 11000) < 0.001, "36089.24 ft is 11 000 m");
  await page.selectOption("#altitude-unit", "m");
  await page.fill("#altitude", "11000");

  // 5. Bad values: an inline message naming the value and the range, results marked stale.
  await page.fill("#altitude", "2000000");
  const tooHigh = await message("altitude");
  check(/2000000 m is outside the allowed range -5000 to 1000000 m/.test(tooHigh), `message for 2 000 000 m: "${tooHigh}"`);
  check((await page.getAttribute("#altitude", "aria-invalid")) === "true", "the bad input is marked invalid");
  check(await page.$eval("#view-point .results", (e) => e.classList.contains("stale")), "results marked stale");
  await page.fill("#altitude", "abc");
  check(/is not a number/.test(await message("altitude")), "message for text");
  await page.fill("#altitude", "11000");
  check((await message("altitude")) === "", "the message clears");
  await page.fill("#cd", "-1");
  check(/drag coefficient/.test(await message("cd")), `message for a negative Cd: "${await message("cd")}"`);
  await page.fill("#cd", "0.45");

  // 6. The units toggle and Mach input.
  await page.check('input[name="units"][value="us"]');
  const psf = Number((await shown("pressurePa")).trim());
  check(Math.abs(psf * 47.88025898033584 - s11.pressurePa) < 1e-3 * s11.pressurePa, `pressure in lbf/ft²: ${psf}`);
  await page.check('input[name="units"][value="si"]');
  await page.check('input[name="speed-kind"][value="mach"]');
  await page.fill("#mach", "0.8");
  check(Object.is(await value("mach"), 0.8), "Mach given");
  check(Object.is(await value("dynamicPressurePa"), aerostrata.dynamicPressureFromMachPa(s11.pressurePa, 0.8)), "q from Mach");
  await page.fill("#mach", "-2");
  check(/Mach number -2 is outside the allowed range 0 to 1000/.test(await message("mach")), "message for Mach -2");
  await page.fill("#mach", "0.85");
  check(await page.isVisible('[data-marker="temperatureK"]'), "the current point is marked on the profile");
  await page.screenshot({ path: join(shots, "web-calculator.png"), fullPage: true });

  // 7. Keyboard: the tabs answer the arrow keys.
  await page.focus("#tab-point");
  await page.keyboard.press("ArrowRight");
  check(await page.isVisible("#view-flight"), "ArrowRight opens the flight view");

  // 8. A flight CSV, uploaded: the maximum q the page reports is the module's.
  const flightDone = () => page.waitForFunction(() => ["done", "failed", "empty"].includes(document.body.dataset.flight), null, { timeout: 120000 });
  const flightValue = async (key) => Number(await page.getAttribute(`#flight-summary [data-quantity="${key}"]`, "data-value"));
  const flightMessage = () => page.textContent("#flight-msg");
  await page.setInputFiles("#flight-file", join(root, "examples/web-calculator/demo-flight.csv"));
  await flightDone();
  await page.waitForSelector('#flight-summary [data-quantity="maxDynamicPressurePa"]');
  const reported = await flightValue("maxDynamicPressurePa");
  const demo = readFileSync(join(root, "examples/web-calculator/demo-flight.csv"), "utf8");
  const csv = rowsOf(demo);
  const scan = aerostrata.AtmosphereModel.standard().scanFlight(
    csv.map((r) => r[0]),
    csv.map((r) => r[1]),
    csv.map((r) => r[2]),
    { drag: 0.45, referenceAreaM2: 0.0064 },
  );
  check(Object.is(reported, scan.summary.maxDynamicPressure.dynamicPressurePa), `max q: page ${reported}, module ${scan.summary.maxDynamicPressure.dynamicPressurePa}`);
  // It is at least every sample's rho V^2 / 2 (the refinement never lowers the peak).
  check(reported >= Math.max(...scan.points.dynamicPressurePa), "max q at least every sample's q");
  check(await page.isVisible('[data-marker="max-q"]'), "the maximum q is marked on the chart");
  check((await page.textContent("#view-flight .results .caution")).includes("Not certified flight software"), "the caution stands beside the flight summary");
  check((await page.textContent("#view-point .results .caution")).includes("range-safety rules"), "the caution stands beside the loads");
  await page.screenshot({ path: join(shots, "web-calculator-flight.png"), fullPage: true });

  // 9. A bad flight: a time that does not increase, and a malformed line (without a
  // header, as the command line reads it: time, altitude, velocity).
  await page.fill("#flight-csv", "0,0,0\n1,100,150\n1,200,160\n");
  await flightDone();
  check(/flight sample point 2: time \(s\) must be after the previous sample's/.test(await flightMessage()), "message for a repeated time");
  await page.fill("#flight-csv", "0,0,0\n1,100\n");
  await flightDone();
  check(/^line 2: 2 cells, but the header has 3 columns/.test(await flightMessage()), `message for a short line: "${await flightMessage()}"`);
  check((await page.getAttribute("#flight-csv", "aria-invalid")) === "true", "the pasted samples are marked invalid");
  await page.fill("#flight-csv", "time,altitude,velocity\n0,0,0\n1,100ft,abc\n");
  await flightDone();
  check(/^line 3: column 3: 'abc' is not a number/.test(await flightMessage()), `message for a bad cell: "${await flightMessage()}"`);
  // Flights too short for a curve still draw without an error in the page (checked at
  // the end): one sample (an axis of no time span), a header and no samples.
  await page.fill("#flight-csv", "0,100,50\n");
  await flightDone();
  check((await page.textContent("#flight-status")) === "Pasted samples: 1 sample.", `one sample: "${await page.textContent("#flight-status")}"`);
  check(await page.isVisible('[data-marker="max-q"]'), "the maximum q of a single sample is marked");
  await page.fill("#flight-csv", "time,altitude,velocity\n");
  await flightDone();
  check((await flightValue("samples")) === 0, "a header without samples: no samples");
  check(/no samples/.test(await page.textContent("#flight-chart")), "a header without samples: the chart says so");

  // 10. A header in feet gives the same maximum q as the same flight in metres (within
  // the rounding of writing x / 0.3048 in decimal; the foot is 0.3048 m exactly).
  await page.setInputFiles("#flight-file", upload("demo-in-feet.csv", Buffer.from(inFeet(csv))));
  await flightDone();
  const inFeetQ = await flightValue("maxDynamicPressurePa");
  check(Math.abs(inFeetQ - reported) <= 1e-9 * reported, `max q of the flight in feet ${inFeetQ}, in metres ${reported}`);
  check(Math.abs((await flightValue("maxDynamicPressureAltitudeM")) - scan.summary.maxDynamicPressure.altitudeM) < 1e-6, "altitude of max q read from feet");

  // 10a. A flight with the velocity's direction through a wind typed on the page: the
  // q-alpha the page shows is the module's for the same file and wind (read by the
  // module's readFlightCsv and scanned with the same options); without the wind the
  // axis lies along the air-relative velocity and q-alpha is 0 (common practice, no
  // source: alpha is the angle between the axis and the air-relative velocity).
  const vector = vectorFlight();
  const { ignored: vectorIgnored, ...vectorSamples } = aerostrata.readFlightCsv(vector);
  check(vectorIgnored.length === 0 && vectorSamples.velocityEastMS !== undefined, "the vector flight is read as components");
  const standard = aerostrata.AtmosphereModel.standard();
  const crosswind = { altitudeM: [0], windSpeedMS: [15], windDirectionDeg: [0] };
  const vehicle = { drag: 0.45, referenceAreaM2: 0.0064 };
  const vectorScan = standard.scanFlight({ ...vectorSamples, vehicle, winds: crosswind, qLimitPa: 35000 });
  const calm = standard.scanFlight({ ...vectorSamples, vehicle });
  await page.fill("#flight-wind-speed", "15");
  await page.fill("#flight-wind-direction", "0");
  await page.setInputFiles("#flight-file", upload("vector-crosswind.csv", Buffer.from(vector)));
  await flightDone();
  await page.waitForSelector('#flight-summary [data-quantity="maxQAlphaPaDeg"]');
  const qAlpha = await flightValue("maxQAlphaPaDeg");
  const moduleQAlpha = vectorScan.summary.maxQAlpha;
  check(Object.is(qAlpha, moduleQAlpha.value), `max q-alpha: page ${qAlpha}, module ${moduleQAlpha.value}`);
  check(moduleQAlpha.value > 1000, `the crosswind gives a q-alpha worth checking (${moduleQAlpha.value} Pa deg)`);
  // (The angle between two parallel vectors rounds to about 1e-15 rad, not exactly 0.)
  check(calm.summary.maxQAlpha.value < 1e-9 * moduleQAlpha.value, `no q-alpha without the wind (axis along the velocity): ${calm.summary.maxQAlpha.value}`);
  const qAlphaText = await page.textContent('#flight-summary [data-quantity="maxQAlphaPaDeg"]');
  check(qAlphaText === String(Number(moduleQAlpha.value.toPrecision(6))), `q-alpha written on the page: "${qAlphaText}"`);
  check(Object.is(await flightValue("maxQAlphaTimeS"), moduleQAlpha.timeS), "time of max q-alpha");
  check(Object.is(await flightValue("maxQAlphaAltitudeM"), moduleQAlpha.altitudeM), "altitude of max q-alpha");
  check(Object.is(await flightValue("maxQAlphaMach"), moduleQAlpha.mach), "Mach at max q-alpha");
  check(Object.is(await flightValue("maxDynamicPressurePa"), vectorScan.summary.maxDynamicPressure.dynamicPressurePa), "max q of the vector flight through the wind");
  // Hand-worked at the sample of the largest q-alpha: alpha = acos(u . a / (|u| |a|)) with
  // u the ground velocity less the wind (a north wind of 15 m/s blows toward the south, so
  // u_north = +15) and a the axis along the ground velocity; q-alpha = q alpha.
  {
    const i = moduleQAlpha.sampleIndex;
    const [e, n, u] = [vectorSamples.velocityEastMS[i], vectorSamples.velocityNorthMS[i], vectorSamples.velocityUpMS[i]];
    const air = [e, n + 15, u];
    const dot = air[0] * e + air[1] * n + air[2] * u;
    const alpha = (Math.acos(dot / (Math.hypot(...air) * Math.hypot(e, n, u))) * 180) / Math.PI;
    const q = vectorScan.points.dynamicPressurePa[i];
    check(Math.abs(q * alpha - qAlpha) <= 1e-9 * qAlpha, `q-alpha by hand ${q * alpha}, page ${qAlpha}`);
  }
  const qAlphaSeries = await page.$eval('#flight-chart [data-series="qAlphaPaDeg"]', (p) => ({ points: Number(p.dataset.points), highest: Number(p.dataset.highest) }));
  check(qAlphaSeries.points > 0, "the chart draws q-alpha");
  // q-alpha is undefined (NaN) at the first sample, at rest on the pad: skipped.
  const highestQAlpha = vectorScan.points.qAlphaPaDeg.reduce((best, v) => (v > best ? v : best), -Infinity);
  check(Object.is(qAlphaSeries.highest, highestQAlpha) && highestQAlpha === moduleQAlpha.value, `the q-alpha line keeps the highest sample: ${qAlphaSeries.highest}`);
  check((await page.textContent("#view-flight .results .caution")).includes("range-safety rules"), "the caution stands beside q-alpha");

  // 10b. A q limit typed with its unit: the page lists the module's exceedance intervals.
  await page.fill("#flight-q-limit", "35kPa");
  await flightDone();
  await page.waitForFunction(() => !document.getElementById("flight-exceedances").hidden);
  const intervals = await page.$$eval("#flight-exceedance-list li", (lis) => lis.map((li) => ({ start: Number(li.dataset.start), end: Number(li.dataset.end), peak: Number(li.dataset.peak), text: li.textContent })));
  const expected = vectorScan.summary.qExceedances;
  check(expected.length >= 1, `the module finds q above 35 kPa (${expected.length} intervals)`);
  check(
    intervals.length === expected.length && expected.every((x, k) => Object.is(intervals[k].start, x.startTimeS) && Object.is(intervals[k].end, x.endTimeS) && Object.is(intervals[k].peak, x.peak)),
    `exceedances: page ${JSON.stringify(intervals)}, module ${JSON.stringify(expected)}`,
  );
  check(/^[\d.]+ s( \([^)]*\))? to [\d.]+ s( \([^)]*\))?: peak [\d.]+ Pa at [\d.]+ s$/.test(intervals[0]?.text ?? ""), `an interval written out: "${intervals[0]?.text}"`);
  check((await page.textContent("#flight-q-limit-note")) === "read as 35000 Pa", `the limit read as: "${await page.textContent("#flight-q-limit-note")}"`);
  await page.screenshot({ path: join(shots, "web-calculator-flight-loads.png"), fullPage: true });
  await page.setViewportSize({ width: 390, height: 844 });
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
  check((await page.evaluate(() => document.documentElement.scrollWidth)) <= 390, "the flight view with q-alpha fits 390 px");
  await page.screenshot({ path: join(shots, "web-calculator-phone-flight-loads.png"), fullPage: true });
  await page.setViewportSize({ width: 1180, height: 1500 });

  // 10b'. The same crosswind from a wind file (one level, held above and below it, as the
  // typed wind is): the page gives the module's q-alpha to the bit. A file the module
  // refuses is named beside the file input with its line; a typed wind beside a file is
  // refused (one way or the other).
  await page.fill("#flight-q-limit", "");
  await page.fill("#flight-wind-speed", "");
  await page.fill("#flight-wind-direction", "");
  await page.setInputFiles("#flight-winds-file", upload("north-wind.csv", Buffer.from("# invented\naltitude_m,wind_speed_m_s,wind_direction_deg\n0,15,0\n")));
  await flightDone();
  check(Object.is(await flightValue("maxQAlphaPaDeg"), moduleQAlpha.value), `max q-alpha through the wind file: ${await flightValue("maxQAlphaPaDeg")}`);
  await page.setInputFiles("#flight-winds-file", upload("bad-wind.csv", Buffer.from("altitude_m,wind_speed_m_s,wind_direction_deg\n0,15,0\n100,x,0\n")));
  await flightDone();
  check(/^line 3\b/.test(await message("flight-winds-file")), `a bad wind file: "${await message("flight-winds-file")}"`);
  check((await page.getAttribute("#flight-winds-file", "aria-invalid")) === "true", "the refused wind file's input is marked invalid");
  await page.fill("#flight-wind-speed", "15");
  await page.fill("#flight-wind-direction", "0");
  await flightDone();
  check(/one way/.test(await message("flight-winds-file")), `a typed wind beside a file: "${await message("flight-winds-file")}"`);
  await page.setInputFiles("#flight-winds-file", []);
  await flightDone();
  check((await message("flight-winds-file")) === "", "the wind file's message goes with the file");

  // 10c. A wind for a file without the velocity's direction is refused beside the wind.
  await page.fill("#flight-q-limit", "");
  await page.fill("#flight-csv", csv.slice(0, 20).map((r) => r.join(",")).join("\n"));
  await flightDone();
  check(/needs the velocity's direction/.test(await message("flight-wind-speed")), `a wind for a speed-only file: "${await message("flight-wind-speed")}"`);
  check(await page.isHidden("#flight-exceedances"), "no exceedance list without a limit");
  await page.fill("#flight-wind-speed", "");
  await page.fill("#flight-wind-direction", "");

  // 10c'. The same boost as speed, flight-path angle and heading with the axis a degree
  // above the path, and no wind: the page's q-alpha is the module's for the same columns,
  // and about q times 1 degree (hand-worked: the axis and the velocity lie in one vertical
  // plane, 86 - 85 = 1 degree apart).
  const path = pathFlight();
  const { ignored: pathIgnored, ...pathSamples } = aerostrata.readFlightCsv(path);
  check(pathIgnored.length === 0 && pathSamples.headingDeg !== undefined && pathSamples.axisElevationDeg !== undefined, "the path flight is read as speed, path, heading and axis");
  const pathScan = standard.scanFlight({ ...pathSamples, vehicle });
  await page.setInputFiles("#flight-file", upload("path-axis.csv", Buffer.from(path)));
  await flightDone();
  const pathQAlpha = await flightValue("maxQAlphaPaDeg");
  check(Object.is(pathQAlpha, pathScan.summary.maxQAlpha.value), `max q-alpha of the path file: page ${pathQAlpha}, module ${pathScan.summary.maxQAlpha.value}`);
  const pathQ = pathScan.points.dynamicPressurePa[pathScan.summary.maxQAlpha.sampleIndex];
  check(Math.abs(pathQAlpha - pathQ) <= 1e-9 * pathQ, `q-alpha at a 1 degree angle of attack ${pathQAlpha}, q there ${pathQ}`);
  // In US units the page shows the catalogue's psf deg, converted by the module.
  await page.check('input[name="units"][value="us"]');
  const usText = await page.textContent('#flight-summary [data-quantity="maxQAlphaPaDeg"] + dd.u');
  const usValue = await page.textContent('#flight-summary [data-quantity="maxQAlphaPaDeg"]');
  check(usText === "psf·deg" && usValue === String(Number(aerostrata.toUs("q_alpha", pathQAlpha).toPrecision(6))), `q-alpha in US units: "${usValue} ${usText}"`);
  await page.check('input[name="units"][value="si"]');

  // 10d. A coarsely sampled flight with a corner: the maximum q is bounded but not
  // resolved, and the page advises the module's spacing.
  const coarse = coarseCorner();
  const coarseRows = rowsOf(coarse);
  const coarseScan = standard.scanFlight(
    coarseRows.map((r) => r[0]),
    coarseRows.map((r) => r[1]),
    coarseRows.map((r) => r[2]),
    vehicle,
  );
  const coarsePeak = coarseScan.summary.maxDynamicPressure;
  check(!coarsePeak.resolved && coarsePeak.suggestedSpacingS !== null, `the module does not resolve the cornered peak (${JSON.stringify(coarsePeak)})`);
  await page.setInputFiles("#flight-file", upload("coarse-corner.csv", Buffer.from(coarse)));
  await flightDone();
  const advice = await page.textContent("#flight-resolution");
  check((await page.getAttribute("#flight-resolution", "data-state")) === "resample", "the coarse flight is marked for resampling");
  check(advice.includes(`Resample the flight at ${Number(coarsePeak.suggestedSpacingS.toPrecision(6))} s or finer`), `the advice names the module's spacing: "${advice}"`);
  check(Object.is(await flightValue("maxDynamicPressureUncertaintyPa"), coarsePeak.uncertaintyPa), "the uncertainty of max q is the module's");
  check(Object.is(await flightValue("maxDynamicPressureSampleMaxPa"), coarsePeak.sampleMaxPa), "the largest sample of q is the module's");
  check((await page.$$eval('#flight-chart [data-series="qAlphaPaDeg"]', (p) => p.length)) === 0, "no q-alpha panel for a file without direction");
  const plateau = coarseScan.summary.qPlateau;
  check(Object.is(await flightValue("qPlateauStartS"), plateau.startTimeS) && Object.is(await flightValue("qPlateauEndS"), plateau.endTimeS), "the q plateau is the module's");
  await page.screenshot({ path: join(shots, "web-calculator-flight-resample.png"), fullPage: true });
  standard.free();

  // 11. The upload limit: a 21 MB file is refused at once, with its size and the limit.
  const bigPath = upload("too-big.csv", oversized(21_000_000));
  let started = performance.now();
  await page.setInputFiles("#flight-file", bigPath);
  await page.waitForFunction(() => document.getElementById("flight-msg").textContent !== "");
  timings.push(["refusal of a 21 MB flight file, from setInputFiles to the message", performance.now() - started]);
  check(/too-big\.csv is 21\.0 MB; the page reads files of at most 20\.0 MB/.test(await flightMessage()), `message for 21 MB: "${await flightMessage()}"`);
  check((await page.getAttribute("#flight-file", "aria-invalid")) === "true", "the refused file's input is marked invalid");
  check((await page.$$eval("#flight-summary dd", (dds) => dds.length)) === 0, "no summary after a refused file");

  // 12. Random bytes: the page answers with a message naming a line, and stays free.
  // A monitor in the page records the longest gap between 10 ms timer ticks (a stall of
  // the main thread); a click on a control is timed while the worker is busy.
  const startMonitor = () =>
    page.evaluate(() => {
      let last = performance.now();
      window.longestStall = 0;
      window.monitor = setInterval(() => {
        const now = performance.now();
        window.longestStall = Math.max(window.longestStall, now - last);
        last = now;
      }, 10);
    });
  const stopMonitor = () => page.evaluate(() => (clearInterval(window.monitor), window.longestStall));
  const timedClick = async () => {
    const before = await page.evaluate(() => document.querySelector(".grammar").open);
    const t = performance.now();
    await page.click(".grammar summary");
    await page.waitForFunction((was) => document.querySelector(".grammar").open !== was, before);
    return performance.now() - t;
  };
  await startMonitor();
  const noisePath = upload("noise.bin", noise(8_000_000));
  started = performance.now();
  await page.setInputFiles("#flight-file", noisePath);
  const clickDuringNoise = await timedClick();
  await page.waitForFunction(() => document.getElementById("flight-msg").textContent !== "", null, { timeout: 60000 });
  timings.push(["answer to 8 MB of random bytes, from setInputFiles to the message", performance.now() - started]);
  timings.push(["a click handled while the random bytes are read", clickDuringNoise]);
  timings.push(["longest main-thread stall while the random bytes are read", await stopMonitor()]);
  check(/^line \d+: /.test(await flightMessage()), `message for random bytes names a line: "${(await flightMessage()).slice(0, 120)}"`);
  check((await page.$$eval("#flight-summary dd", (dds) => dds.length)) === 0, "no summary for random bytes");

  // 13. A million samples: the chart draws, thinned to each pixel column's lowest and
  // highest sample, with the peak kept and marked; the numbers are the module's.
  const long = longFlight(1_000_000);
  check(Buffer.byteLength(long) < 20_000_000, `the long flight fits the upload limit (${Buffer.byteLength(long)} bytes)`);
  const longSamples = aerostrata.readFlightCsv(long);
  const longScan = aerostrata.AtmosphereModel.standard().scanFlight(longSamples.timeS, longSamples.altitudeM, longSamples.velocityMS, { drag: 0.45, referenceAreaM2: 0.0064 });
  let highestSampleQ = -Infinity;
  for (const q of longScan.points.dynamicPressurePa) if (q > highestSampleQ) highestSampleQ = q;
  await startMonitor();
  const longPath = upload("million.csv", Buffer.from(long));
  started = performance.now();
  await page.setInputFiles("#flight-file", longPath);
  const clickDuringScan = await timedClick();
  await flightDone();
  timings.push(["chart of 1 000 000 samples, from setInputFiles to the chart drawn", performance.now() - started]);
  timings.push(["a click handled while the million samples are read and scanned", clickDuringScan]);
  timings.push(["longest main-thread stall while the million samples are read and scanned", await stopMonitor()]);
  check((await page.evaluate(() => document.body.dataset.flight)) === "done", `the million samples scanned: "${await flightMessage()}"`);
  const longQ = await flightValue("maxDynamicPressurePa");
  check(Object.is(longQ, longScan.summary.maxDynamicPressure.dynamicPressurePa), `max q of a million samples: page ${longQ}, module ${longScan.summary.maxDynamicPressure.dynamicPressurePa}`);
  check(longScan.summary.machUndefinedSamples > 0 && Object.is(await flightValue("machUndefinedSamples"), longScan.summary.machUndefinedSamples), `samples without a Mach number (above 86 km): page ${await flightValue("machUndefinedSamples")}, module ${longScan.summary.machUndefinedSamples}`);
  check(Object.is(await flightValue("samples"), 1_000_000), "a million samples counted");
  check(await page.isVisible('[data-marker="max-q"]'), "the maximum q of a million samples is marked");
  const qPath = await page.$eval('#flight-chart [data-series="dynamicPressurePa"]', (p) => ({ points: Number(p.dataset.points), highest: Number(p.dataset.highest), d: p.getAttribute("d") }));
  check(qPath.points > 0 && qPath.points <= 2 * 1000, `the q line is thinned to at most two points per column: ${qPath.points}`);
  check(Object.is(qPath.highest, highestSampleQ), `the thinned q line keeps the highest sample: ${qPath.highest}, module ${highestSampleQ}`);
  check(/^M[\d.]+,[\d.]+(L[\d.]+,[\d.]+)+$/.test(qPath.d), "the q line is one unbroken path");
  check((await page.$eval('#flight-chart [data-series="mach"]', (p) => p.getAttribute("d").split("M").length - 1)) >= 2, "the Mach line breaks where Mach is not defined (above 86 km)");
  await page.screenshot({ path: join(shots, "web-calculator-million.png"), fullPage: true });

  // 14. An error beside its field: a bare offset of 400 (K) is no day's offset.
  await page.click("#tab-point");
  await page.selectOption("#model-kind", "offset");
  await page.fill("#offset", "400");
  const offsetMessage = await message("offset");
  check(/400 K is above any day's offset from the standard temperature \(-100 to 100 K\)/.test(offsetMessage), `message beside the offset: "${offsetMessage}"`);
  check((await page.getAttribute("#offset", "aria-invalid")) === "true", "the offset is marked invalid");
  check(/^none until/.test(await page.textContent("#model-spec")), `no model spec shown for a refused offset: "${await page.textContent("#model-spec")}"`);
  check((await page.$$eval(".msg", (ms) => ms.filter((m) => m.textContent !== "").map((m) => m.id))).join() === "offset-msg", "the offset's message is the only one shown");
  check(await page.$eval("#view-point .results", (e) => e.classList.contains("stale")), "results marked stale for a bad offset");
  await page.screenshot({ path: join(shots, "web-calculator-error.png"), fullPage: true });
  await page.selectOption("#model-kind", "isothermal");
  await page.fill("#iso-t", "15");
  check(/15 K is below any air temperature \(120 to 350 K\); write 15degC or 288\.15K/.test(await message("iso-t")), `message beside the isothermal temperature: "${await message("iso-t")}"`);

  // 15. The model selector gives the module's numbers (AtmosphereModel.fromSpec of the
  // spec the page shows, bit for bit), at 11 000 m.
  const z = 11000;
  await page.fill("#altitude", String(z));
  const sameAsModule = async (what, model) => {
    const expected = model.state(z);
    for (const key of ["temperatureK", "pressurePa", "densityKgM3", "speedOfSoundMS"]) {
      const ours = await value(key);
      check(Object.is(ours, expected[key]), `${what}: ${key} page ${ours}, module ${expected[key]}`);
    }
  };
  const models = [
    ["offset", { offset: "15" }, "offset=15K"],
    ["hydrostatic-offset", { offset: "-10C", p0: "1020" }, "hydrostatic-offset=-10degC,p0=1020hPa"],
    ["isothermal", { "iso-t": "250", "iso-p0": "29.5inHg" }, "isothermal=250K,p0=29.5inHg"],
    ["exponential", { "exp-rho0": "1.225", "exp-h": "8.5km", "exp-t": "" }, "exponential=1.225kg/m3,8.5km"],
    ["standard", {}, "standard"],
  ];
  for (const [kind, fields, spec] of models) {
    await page.selectOption("#model-kind", kind);
    for (const [id, text] of Object.entries(fields)) await page.fill(`#${id}`, text);
    check((await page.textContent("#model-spec")) === spec, `the page writes ${spec}: ${await page.textContent("#model-spec")}`);
    await sameAsModule(spec, aerostrata.AtmosphereModel.fromSpec(spec));
  }
  // In US units a bare offset is in degF: 27 degF is the 15 K day.
  await page.check('input[name="units"][value="us"]');
  await page.selectOption("#model-kind", "offset");
  await page.fill("#offset", "27");
  check((await page.textContent("#model-spec")) === "offset=27degF", "a bare US offset is read in degF");
  await sameAsModule("offset=27degF", aerostrata.AtmosphereModel.fromSpec("offset=27degF"));
  await page.check('input[name="units"][value="si"]');
  check((await page.inputValue("#offset")) === "15", `the offset converted back to K: ${await page.inputValue("#offset")}`);
  await page.screenshot({ path: join(shots, "web-calculator-offset.png"), fullPage: true });

  // An uploaded sounding (the invented demo sounding of examples/data), read in the
  // worker; its point and a flight through it against the module's fromSoundingCsv.
  const soundingPath = join(root, "examples/data/vessaro_key_hot_humid.csv");
  const soundingModel = aerostrata.AtmosphereModel.fromSoundingCsv(readFileSync(soundingPath, "utf8"));
  await page.selectOption("#model-kind", "sounding");
  await page.setInputFiles("#sounding-file", soundingPath);
  await page.waitForFunction(() => document.body.dataset.sounding !== "busy" && document.body.dataset.point !== "busy", null, { timeout: 60000 });
  check((await page.textContent("#model-spec")) === "sounding=vessaro_key_hot_humid.csv", "the sounding named in the spec");
  await sameAsModule("the uploaded sounding", soundingModel);
  await page.setInputFiles("#sounding-file", upload("too-big-sounding.csv", oversized(21_000_000)));
  check(/too-big-sounding\.csv is 21\.0 MB/.test(await message("sounding-file")), "a 21 MB sounding is refused beside its field");
  await page.setInputFiles("#sounding-file", soundingPath);
  await page.waitForFunction(() => document.body.dataset.sounding !== "busy" && document.body.dataset.point !== "busy", null, { timeout: 60000 });
  await page.click("#tab-flight");
  const raised = csv.map(([t, zz, v]) => [t, zz + 10, v]);
  await page.fill("#flight-csv", ["time_s,altitude_m,velocity_m_s", ...raised.map((r) => r.join(",")), ""].join("\n"));
  await flightDone();
  const throughSounding = soundingModel.scanFlight(
    raised.map((r) => r[0]),
    raised.map((r) => r[1]),
    raised.map((r) => r[2]),
    { drag: 0.45, referenceAreaM2: 0.0064 },
  );
  const soundingQ = await flightValue("maxDynamicPressurePa");
  check(Object.is(soundingQ, throughSounding.summary.maxDynamicPressure.dynamicPressurePa), `max q through the sounding: page ${soundingQ}, module ${throughSounding.summary.maxDynamicPressure.dynamicPressurePa}`);
  await page.screenshot({ path: join(shots, "web-calculator-sounding-flight.png"), fullPage: true });

  // 16. A phone's width: nothing wider than the screen; screenshots of both views.
  await page.setViewportSize({ width: 390, height: 844 });
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
  check((await page.evaluate(() => document.documentElement.scrollWidth)) <= 390, "the flight view fits 390 px");
  await page.screenshot({ path: join(shots, "web-calculator-phone-flight.png"), fullPage: true });
  await page.click("#tab-point");
  await page.selectOption("#model-kind", "hydrostatic-offset");
  await page.fill("#offset", "15");
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
  check((await page.evaluate(() => document.documentElement.scrollWidth)) <= 390, "the point view fits 390 px");
  await page.screenshot({ path: join(shots, "web-calculator-phone.png"), fullPage: true });

  check(errors.length === 0, `errors in the page: ${errors.join("; ")}`);

  // 20. Served without the upper part (a 404): at 120 km the standard says its tables
  // could not be loaded, and a model that does not need them (isothermal) still answers.
  const bare = await context.newPage();
  await bare.route("**/aerostrata_upper.bin", (route) => route.fulfill({ status: 404, body: "not here" }));
  await bare.goto(url);
  await bare.waitForSelector('body[data-ready="true"]', { timeout: 20000 });
  await bare.fill("#altitude", "120000");
  await bare.waitForFunction(() => document.body.dataset.point === "failed", null, { timeout: 60000 });
  const missing = await bare.textContent("#altitude-msg");
  check(/upper atmosphere's tables \(above 86 km\) could not be loaded: loadUpper: fetching .*aerostrata_upper\.bin gave HTTP status 404/.test(missing), `message without the upper part: "${missing}"`);
  await bare.selectOption("#model-kind", "isothermal");
  await bare.fill("#iso-t", "250");
  await bare.fill("#iso-p0", "29.5inHg");
  await bare.waitForFunction(() => document.body.dataset.point === "done", null, { timeout: 60000 });
  const isothermal = aerostrata.AtmosphereModel.fromSpec("isothermal=250K,p0=29.5inHg").state(120000);
  const bareTemperature = await bare.getAttribute('#view-point [data-quantity="temperatureK"]', "data-value");
  check(Number(bareTemperature) === isothermal.temperatureK, `isothermal at 120 km without the upper part: ${bareTemperature}`);
  check((await bare.textContent("#altitude-msg")) === "", "no message for a model that does not need the upper part");
  await bare.close();
} finally {
  await context.close();
  rmSync(profile, { recursive: true, force: true });
  rmSync(uploads, { recursive: true, force: true });
}

for (const [what, ms] of timings) console.log(`timing: ${what}: ${ms.toFixed(0)} ms`);
for (const f of failures) console.error(`FAIL: ${f}`);
console.log(`${passed} passed, ${failures.length} failed`);
process.exit(failures.length === 0 ? 0 : 1);
