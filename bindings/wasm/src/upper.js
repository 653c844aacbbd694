// The JS side of the upper atmosphere's loading (src/upper.rs): `loadUpper` fetches
// (browsers, bundlers) or reads (Node) the tables' file, aerostrata_upper.bin, and hands
// its bytes to the module, once. Apart from glue.js, which holds the argument readers and
// result builders, so that each file stays readable.
//
// Plain `export function` declarations only: `cargo xtask wasm` turns this file into
// CommonJS for the Node build by rewriting exactly those (and `import.meta.url`).

// The upper atmosphere's tables (86 to 1000 km) are a file beside the module,
// aerostrata_upper.bin, that `loadUpper` reads once (src/upper.rs). This file sits three
// levels below the module (snippets/<crate>/src/), so the file's URL is found from its
// own; `cargo xtask wasm` rewrites `import.meta.url` for the CommonJS Node build.
const UPPER_FILE = "aerostrata_upper.bin";
let upperInstall = null;
let upperLoading = null;

// Called once at start with an AtmosphereModel: its class's hidden static `__loadUpper`
// takes the file's bytes into the module.
export function useUpperLoader(instance) {
  const model = Object.getPrototypeOf(instance).constructor;
  upperInstall = (bytes) => model.__loadUpper(bytes);
}

// `loadUpper(source?)`: a promise of the tables loaded (at once when `loaded`). Calls
// without a source while one is under way share it; a failed one may be tried again.
export function loadUpper(source, loaded) {
  if (loaded) return Promise.resolve();
  if (source === undefined && upperLoading !== null) return upperLoading;
  const loading = upperBytes(source).then((bytes) => {
    upperInstall(bytes);
  });
  if (source === undefined) {
    upperLoading = loading;
    loading.catch(() => {
      upperLoading = null;
    });
  }
  return loading;
}

function isNode() {
  return typeof process !== "undefined" && process.versions != null && process.versions.node != null;
}

async function upperBytes(source) {
  if (source instanceof Uint8Array || source instanceof ArrayBuffer) return source;
  if (typeof Response !== "undefined" && source instanceof Response) return responseBytes(source, "the Response given");
  if (source !== undefined && typeof source !== "string" && !(source instanceof URL)) {
    const given = source === null ? "null" : Array.isArray(source) ? "an array" : typeof source === "number" ? "the number " + source : "a " + typeof source;
    throw new TypeError("loadUpper's source must be a URL, a string, a Response, a Uint8Array or an ArrayBuffer, got " + given);
  }
  // A literal URL beside `import.meta.url`, which bundlers recognise as an asset to ship.
  const where = source === undefined ? new URL("../../../aerostrata_upper.bin", import.meta.url) : source;
  const text = String(where);
  if (isNode() && !/^https?:/i.test(text)) return readLocal(text.startsWith("file:") ? new URL(text) : text);
  let response;
  try {
    response = await fetch(where);
  } catch (e) {
    throw new Error("loadUpper: cannot fetch " + text + ": " + e.message);
  }
  return responseBytes(response, text);
}

async function responseBytes(response, what) {
  if (!response.ok) {
    throw new Error(
      "loadUpper: fetching " + what + " gave HTTP status " + response.status +
        ": serve " + UPPER_FILE + " beside aerostrata_bg.wasm, or pass its URL to loadUpper",
    );
  }
  return new Uint8Array(await response.arrayBuffer());
}

// Node: its file system (the Node build has `require`; the ES-module build asks Node).
async function readLocal(path) {
  let fs;
  if (typeof require === "function") {
    fs = require("fs");
  } else if (typeof process.getBuiltinModule === "function") {
    fs = process.getBuiltinModule("fs");
  } else {
    const name = "node:fs";
    fs = await import(/* webpackIgnore: true */ /* @vite-ignore */ name);
  }
  try {
    return new Uint8Array(fs.readFileSync(path));
  } catch (e) {
    throw new Error("loadUpper: cannot read " + String(path) + ": " + e.message);
  }
}
