// The web calculator (examples/web-calculator) in headless Chromium, driven by
// playwright-core: type values as a user does and read the results against the
// reference vectors (tests/vectors/usa76_lower.csv: U.S. Standard Atmosphere 1976, from
// memory of the printed table, each cell within half a unit of its last digit), enter bad
// values and read the messages, load a flight CSV and read the maximum dynamic pressure
// against the Node build of the same module. Saves screenshots.
//
// Usage (cargo xtask browser-test does this): node calculator.test.mjs URL SHOTS_DIR VECTORS_DIR
// with URL the page served on 127.0.0.1. Prints "N passed, M failed"; exit status 1 on
// any failure.

import { mkdirSync, mkdtempSync, readFileSync, rmSync } from "node:fs";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";

import { chromium } from "playwright-core";

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

let passed = 0;
const failures = [];
function check(ok, what) {
  if (ok) passed++;
  else failures.push(what);
}

mkdirSync(shots, { recursive: true });
const profile = mkdtempSync(join(tmpdir(), "stratacalc-chromium-"));
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
  await page.goto(url);
  await page.waitForSelector('body[data-ready="true"]', { timeout: 20000 });

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
  await page.setInputFiles("#flight-file", join(root, "examples/web-calculator/demo-flight.csv"));
  await page.waitForSelector('#flight-summary [data-quantity="maxDynamicPressurePa"]');
  const reported = Number(await page.getAttribute('#flight-summary [data-quantity="maxDynamicPressurePa"]', "data-value"));
  const csv = readFileSync(join(root, "examples/web-calculator/demo-flight.csv"), "utf8")
    .split("\n")
    .filter((l) => /^[\d.]/.test(l))
    .map((l) => l.split(",").map(Number));
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
  await page.screenshot({ path: join(shots, "web-calculator-flight.png"), fullPage: true });

  // 9. A bad flight: a time that does not increase, and a malformed line.
  await page.fill("#flight-csv", "0,0,0\n1,100,150\n1,200,160\n");
  check(/flight sample point 2: time \(s\) must be after the previous sample's/.test(await page.textContent("#flight-msg")), "message for a repeated time");
  await page.fill("#flight-csv", "0,0,0\n1,100\n");
  check(/Line 2: expected three numbers/.test(await page.textContent("#flight-msg")), "message for a short line");

  check(errors.length === 0, `errors in the page: ${errors.join("; ")}`);
} finally {
  await context.close();
  rmSync(profile, { recursive: true, force: true });
}

for (const f of failures) console.error(`FAIL: ${f}`);
console.log(`${passed} passed, ${failures.length} failed`);
process.exit(failures.length === 0 ? 0 : 1);
