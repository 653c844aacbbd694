// Opens page.html of the fresh project in headless Chromium (Debian's, driven by
// playwright-core) and checks what it computed through the import map: the 1976
// standard's sea level (Table I: 288.150 K, 1.01325E+05 Pa) and q = rho V^2 / 2 at
// 1.225 kg/m^3 and 100 m/s, 6125 Pa (hand-worked); and, after loadUpper, Table I's 360.00 K
// at 120 km. Only the page's own server is reached.
//
// Usage (cargo xtask npm-check): node browser.mjs URL PLAYWRIGHT_CORE_DIR
// Prints "browser: ..." and exits 1 on any failure.

import { mkdtempSync, rmSync } from "node:fs";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import { join } from "node:path";

const [url, playwrightDir] = process.argv.slice(2);
if (!url || !playwrightDir) {
  console.error("usage: node browser.mjs URL PLAYWRIGHT_CORE_DIR");
  process.exit(2);
}
const { chromium } = createRequire(join(playwrightDir, "package.json"))("playwright-core");
const profile = mkdtempSync(join(tmpdir(), "aerostrata-importmap-chromium-"));
const context = await chromium.launchPersistentContext(profile, {
  executablePath: "/usr/bin/chromium",
  headless: true,
  args: ["--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking"],
});
let failure = null;
try {
  const host = new URL(url).host;
  const requested = [];
  await context.route("**/*", (route) => {
    const target = new URL(route.request().url());
    requested.push(target.pathname);
    return target.host === host ? route.continue() : route.abort();
  });
  const page = await context.newPage();
  const errors = [];
  page.on("pageerror", (error) => errors.push(String(error)));
  await page.goto(url);
  // A module that cannot be resolved never runs the page's script: say what was asked for.
  const answered = await page
    .waitForSelector("#result[data-done]", { state: "attached", timeout: 30_000 })
    .then(() => true, () => false);
  const text = answered ? await page.textContent("#result") : `nothing within 30 s (requests: ${requested.join(", ")})`;
  const result = text.startsWith("{") ? JSON.parse(text) : null;
  const wasm = requested.some((path) => path.endsWith("/node_modules/aerostrata/web/aerostrata_bg.wasm"));
  const upper = requested.some((path) => path.endsWith("/node_modules/aerostrata/web/aerostrata_upper.bin"));
  const full = requested.some((path) => path.endsWith("/node_modules/aerostrata/web/full/aerostrata_bg.wasm"));
  if (!result) failure = `the page says ${text}`;
  else if (Math.abs(result.temperatureK - 288.15) > 0.0005) failure = `temperature ${result.temperatureK} K`;
  else if (Math.abs(result.pressurePa - 101325) > 0.5) failure = `pressure ${result.pressurePa} Pa`;
  else if (!(Math.abs(result.dynamicPressurePa / 6125 - 1) < 1e-12)) failure = `q ${result.dynamicPressurePa} Pa`;
  else if (!wasm) failure = `the default module was not fetched from the installed package: ${requested.join(", ")}`;
  else if (!(Math.abs(result.upperTemperatureK - 360) <= 0.005)) failure = `temperature at 120 km ${result.upperTemperatureK} K`;
  else if (!upper) failure = `the upper part was not fetched from the installed package: ${requested.join(", ")}`;
  else if (result.parsedK !== 288.15) failure = `15 C read as ${result.parsedK} K after loadFull`;
  else if (!full) failure = `the full module was not fetched from the installed package: ${requested.join(", ")}`;
  else if (errors.length) failure = `page errors: ${errors.join("; ")}`;
  else console.log(`browser: aerostrata ${result.version} through the import map: sea level ${result.temperatureK} K, ${result.pressurePa} Pa, ${result.upperTemperatureK} K at 120 km; full part loaded`);
} catch (error) {
  failure = String(error);
} finally {
  await context.close();
  rmSync(profile, { recursive: true, force: true });
}
if (failure) {
  console.error(`browser: ${failure}`);
  process.exit(1);
}
