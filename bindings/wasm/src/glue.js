// The JS side of the aerostrata wasm module: reading JS arguments and building result
// objects. Rust calls these through wasm-bindgen imports (src/js.rs).
//
// Why here and not in Rust: checking JS types, walking option objects and making plain
// objects are JS's own business; done from Rust each property read or write is a call
// across the boundary and several times the code, and the module has a size budget.
// No physics here: numbers are only checked to be JS numbers; every range check, every
// formula and every number of a result comes from the Rust core.
//
// Plain `export function` declarations only: `cargo xtask wasm` turns this file into
// CommonJS for the Node build by rewriting exactly those.

// Most elements any array argument may have (the Rust side's MAX_ELEMENTS).
const MAX_ELEMENTS = 16777216;

function describe(value) {
  if (typeof value === "string") {
    const shown = value.length > 40 ? value.slice(0, 40) + "..." : value;
    return "the string " + JSON.stringify(shown);
  }
  if (value === null) return "null";
  if (value === undefined) return "undefined";
  if (Array.isArray(value)) return "an array";
  if (typeof value === "boolean") return "the boolean " + value;
  if (typeof value === "bigint") return "a bigint";
  if (typeof value === "symbol") return "a symbol";
  if (typeof value === "function") return "a function";
  if (typeof value === "number") return "the number " + value;
  return "an object";
}

function typeError(name, expected, value) {
  return new TypeError(name + " must be " + expected + ", got " + describe(value));
}

// A JS error of `kind` (0 TypeError, 1 RangeError, 2 Error) with `message`.
export function error(kind, message) {
  return kind === 0 ? new TypeError(message) : kind === 1 ? new RangeError(message) : new Error(message);
}

// A number as JS prints it, for messages.
export function numberText(value) {
  return String(value);
}

export function number(name, value) {
  if (typeof value !== "number") throw typeError(name, "a number", value);
  return value;
}

// `undefined` (an omitted argument) reads as `fallback`.
export function numberOr(name, value, fallback) {
  return value === undefined ? fallback : number(name, value);
}

// `undefined` and `null` read as "not given" (`undefined` to Rust's Option).
export function optionalNumber(name, value) {
  return value === undefined || value === null ? undefined : number(name, value);
}

function checkLength(name, length) {
  if (length > MAX_ELEMENTS) {
    throw new RangeError(name + " has " + length + " elements; the allowed range is 0 to " + MAX_ELEMENTS);
  }
}

// A Float64Array or an array of numbers, as a Float64Array (copied into the module's
// memory by the caller).
export function numbers(name, value) {
  if (value instanceof Float64Array) {
    checkLength(name, value.length);
    return value;
  }
  if (!Array.isArray(value)) throw typeError(name, "a Float64Array or an array of numbers", value);
  checkLength(name, value.length);
  const out = new Float64Array(value.length);
  for (let i = 0; i < value.length; i++) {
    const v = value[i];
    if (typeof v !== "number") throw typeError(name + "[" + i + "]", "a number", v);
    out[i] = v;
  }
  return out;
}

// Optional numbers, one per row: a Float64Array (all given) or an array of numbers with
// `null` or `undefined` for "not given". Returned as 2n numbers: the values (0 where not
// given), then 1 or 0 for given or not.
export function optionalNumbers(name, value) {
  if (value instanceof Float64Array) {
    checkLength(name, value.length);
    const out = new Float64Array(2 * value.length);
    out.set(value);
    out.fill(1, value.length);
    return out;
  }
  if (!Array.isArray(value)) throw typeError(name, "a Float64Array or an array of numbers and nulls", value);
  checkLength(name, value.length);
  const n = value.length;
  const out = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const v = value[i];
    if (v === null || v === undefined) continue;
    if (typeof v !== "number") throw typeError(name + "[" + i + "]", "a number or null", v);
    out[i] = v;
    out[n + i] = 1;
  }
  return out;
}

// The index of `value` among the comma-separated `options`; `fallback` (if not -1) when
// it is `undefined`. A non-string is a TypeError, an unknown name a RangeError.
export function choice(name, value, options, fallback) {
  if (value === undefined && fallback >= 0) return fallback;
  const names = options.split(",");
  const list = names.map((n) => '"' + n + '"').join(", ");
  const index = typeof value === "string" ? names.indexOf(value) : -1;
  if (index >= 0) return index;
  const message = name + " must be one of " + list + ", got " + describe(value);
  throw typeof value === "string" ? new RangeError(message) : new TypeError(message);
}

// For an array of strings, the index of each among the comma-separated `options`.
export function choices(name, value, options) {
  if (!Array.isArray(value)) throw typeError(name, "an array of names", value);
  checkLength(name, value.length);
  return Uint32Array.from(value, (v, i) => choice(name + "[" + i + "]", v, options, -1));
}

// An options object with only the comma-separated `allowed` keys; `undefined` for
// `undefined` or `null`.
export function options(name, value, allowed) {
  if (value === undefined || value === null) return undefined;
  if (typeof value !== "object" || Array.isArray(value)) throw typeError(name, "an object", value);
  const keys = allowed.split(",");
  for (const key of Object.keys(value)) {
    if (!keys.includes(key)) {
      throw new TypeError(
        name + ' has an unknown property "' + key + '"; allowed: ' + keys.map((k) => '"' + k + '"').join(", "),
      );
    }
  }
  return value;
}

// Property `key` of an options object (`undefined` when there is no object).
export function get(object, key) {
  return object === undefined ? undefined : object[key];
}

// At most `max` rows of objects with the comma-separated `keys` (numbers or null), the
// first `required` of them required: 2 n k numbers, the values row by row, then 1 or 0
// for given or not.
export function rows(name, value, keys, required, max) {
  if (!Array.isArray(value)) throw typeError(name, "an array of objects", value);
  if (value.length > max) {
    throw new RangeError(name + " has " + value.length + " rows; the allowed range is 0 to " + max);
  }
  const names = keys.split(",");
  const k = names.length;
  const n = value.length;
  const out = new Float64Array(2 * n * k);
  for (let i = 0; i < n; i++) {
    const row = options(name + "[" + i + "]", value[i], keys);
    if (row === undefined) throw typeError(name + "[" + i + "]", "an object", value[i]);
    for (let j = 0; j < k; j++) {
      const place = name + "[" + i + "]." + names[j];
      const v = j < required ? number(place, row[names[j]]) : optionalNumber(place, row[names[j]]);
      if (v !== undefined) {
        out[i * k + j] = v;
        out[n * k + i * k + j] = 1;
      }
    }
  }
  return out;
}

// JSON text parsed, or an object as it is; anything else is a TypeError.
export function json(name, value) {
  if (typeof value === "string") {
    try {
      value = JSON.parse(value);
    } catch (e) {
      throw new Error(name + ": not valid JSON: " + e.message);
    }
  }
  const object = options(name, value, "altitude,rows,below,above");
  if (object === undefined) throw typeError(name, "a JSON string or an object", value);
  return object;
}

function onlyKey(value) {
  if (typeof value !== "object" || value === null || Array.isArray(value)) return "";
  const keys = Object.keys(value);
  return keys.length === 1 ? keys[0] : "";
}

// `below` or `above` of a sounding's JSON form: the blend depth, m, or `undefined` for
// "error" (also when absent).
export function outside(name, value) {
  if (value === undefined || value === "error") return undefined;
  if (onlyKey(value) === "blend_into_us1976" && onlyKey(value.blend_into_us1976) === "depth_m") {
    return number(name + ".blend_into_us1976.depth_m", value.blend_into_us1976.depth_m);
  }
  throw typeError(name, '"error" or {"blend_into_us1976": {"depth_m": number}}', value);
}

// A barometric reference: [0, 0] for "standard" (or omitted), [1, p] for {qnhPa: p},
// [2, p] for {padPressurePa: p}.
export function reference(value) {
  if (value === undefined || value === "standard") return new Float64Array([0, 0]);
  const key = onlyKey(value);
  if (key === "qnhPa") return new Float64Array([1, number("reference.qnhPa", value.qnhPa)]);
  if (key === "padPressurePa") return new Float64Array([2, number("reference.padPressurePa", value.padPressurePa)]);
  throw typeError("reference", '"standard", {qnhPa: number} or {padPressurePa: number}', value);
}

// A drag coefficient: a number as it is, or a table {mach, cd, interpolation} (checked
// for its keys; its arrays are read by `numbers`).
export function drag(name, value) {
  if (typeof value === "number") return value;
  if (typeof value !== "object" || value === null || Array.isArray(value)) {
    throw typeError(name, "a drag coefficient (a number) or a table {mach, cd, interpolation}", value);
  }
  return options(name, value, "mach,cd,interpolation");
}

// A string argument of at most 4096 characters (a quantity's name, a value with a unit).
export function text(name, value) {
  if (typeof value !== "string") throw typeError(name, "a string", value);
  if (value.length > 4096) throw new RangeError(name + " has " + value.length + " characters; the allowed range is 0 to 4096");
  return value;
}

// The text of a file: a string of at most 64 MiB.
export function longText(name, value) {
  if (typeof value !== "string") throw typeError(name, "a string", value);
  if (value.length > 67108864) throw new RangeError(name + " has " + value.length + " characters; the allowed range is 0 to 67108864");
  return value;
}

// A Uint8Array or an ArrayBuffer as a Uint8Array (copied into the module by the caller).
export function bytes(name, value) {
  if (value instanceof Uint8Array) return value;
  if (value instanceof ArrayBuffer) return new Uint8Array(value);
  throw typeError(name, "a Uint8Array or an ArrayBuffer", value);
}

// Six significant digits, as a person reads a number in a message.
export function tidy(value) {
  return String(Number(value.toPrecision(6)));
}

export function parsedValue(si, value, unit, explicit) {
  return { si, value, unit, explicit };
}

// A flight file's samples: `{<keys>: Float64Array, ..., ignored: [headings]}`, the
// columns one after another in `values`; the ignored headings separated by U+001F.
export function flightSamples(keys, values, count, ignored) {
  const out = columns(keys, values, count);
  out.ignored = ignored === "" ? [] : ignored.split("\u001f");
  return out;
}

export function windAt(windEastMS, windNorthMS, windSpeedMS, windDirectionDeg, held) {
  return { windEastMS, windNorthMS, windSpeedMS, windDirectionDeg, held };
}

// Whether a first argument is an options object rather than an array.
export function isOptions(value) {
  return typeof value === "object" && value !== null && !Array.isArray(value) && !ArrayBuffer.isView(value);
}

// Winds aloft: a WindProfile (anything with the `levels()` it has), or the arrays
// {altitudeM, windEastMS, windNorthMS} or {altitudeM, windSpeedMS, windDirectionDeg}.
// Returned flat: [kind (0 components, 1 speed and direction), n, altitudes, a, b].
export function winds(name, value) {
  if (typeof value !== "object" || value === null || Array.isArray(value)) {
    throw typeError(name, "a WindProfile or {altitudeM, windEastMS, windNorthMS} or {altitudeM, windSpeedMS, windDirectionDeg}", value);
  }
  let kind = 0;
  let levels = value;
  if (typeof value.levels === "function") {
    if (value.__wbg_ptr === 0) throw new Error(name + ": this wind profile was freed (its free() was called); make a new one");
    levels = value.levels();
  } else {
    const keys = Object.keys(value);
    kind = keys.includes("windSpeedMS") || keys.includes("windDirectionDeg") ? 1 : 0;
    options(name, value, kind === 0 ? "altitudeM,windEastMS,windNorthMS" : "altitudeM,windSpeedMS,windDirectionDeg");
  }
  const [ka, kb] = kind === 0 ? ["windEastMS", "windNorthMS"] : ["windSpeedMS", "windDirectionDeg"];
  const z = numbers(name + ".altitudeM", levels.altitudeM);
  const a = numbers(name + "." + ka, levels[ka]);
  const b = numbers(name + "." + kb, levels[kb]);
  const n = z.length;
  if (a.length !== n || b.length !== n) {
    throw new RangeError(
      name + ": altitudeM, " + ka + " and " + kb + " must have the same length (one element per level), got " +
        n + ", " + a.length + " and " + b.length,
    );
  }
  const out = new Float64Array(2 + 3 * n);
  out[0] = kind;
  out[1] = n;
  out.set(z, 2);
  out.set(a, 2 + n);
  out.set(b, 2 + 2 * n);
  return out;
}

// Wraps every method and getter on the prototype of `instance` (an object of an exported
// class, made only for this and freed here) so that a call on an object whose free() has
// run throws an Error that says so: wasm-bindgen's own check would throw "null pointer
// passed to rust", which names neither the object nor the cause. A second free() does
// nothing. `__wbg_ptr` is wasm-bindgen's field for the object's memory, 0 once freed (the
// version is pinned in Cargo.toml; the Node tests fail if that changes).
export function guardFreed(instance, className, what, stateKeys) {
  const proto = Object.getPrototypeOf(instance);
  if (typeof instance.__wbg_ptr === "number" && !Object.prototype.hasOwnProperty.call(proto, "__aerostrataGuarded")) {
    Object.defineProperty(proto, "__aerostrataGuarded", { value: true });
    if (stateKeys !== "") {
      Object.defineProperty(proto, "batchInto", { value: batchInto(stateKeys), writable: true, configurable: true });
    }
    for (const key of Object.getOwnPropertyNames(proto)) {
      if (key === "constructor" || key.startsWith("__")) continue;
      const d = Object.getOwnPropertyDescriptor(proto, key);
      const place = className + "." + key + (d.get ? "" : "()");
      // Another class's object would be read as this one's memory: refused too.
      const own = (self) => {
        if (self === null || typeof self !== "object" || !proto.isPrototypeOf(self)) {
          const article = /^[AEIOU]/.test(className) ? "an " : "a ";
          throw new TypeError(place + ": called on something that is not " + article + className);
        }
      };
      const check = (self) => {
        own(self);
        if (self.__wbg_ptr === 0) throw new Error(place + ": this " + what + " was freed (its free() was called); make a new one");
      };
      if (key === "free" && typeof d.value === "function") {
        const free = d.value;
        d.value = function () {
          own(this);
          if (this.__wbg_ptr !== 0) free.call(this);
        };
      } else if (typeof d.value === "function") {
        const f = d.value;
        d.value = function (...args) {
          check(this);
          return f.apply(this, args);
        };
      } else if (d.get) {
        const g = d.get;
        d.get = function () {
          check(this);
          return g.call(this);
        };
      } else {
        continue;
      }
      Object.defineProperty(proto, key, d);
    }
  }
  instance.free();
}

// Altitudes per chunk of `batchInto` (batch.rs's MAX_CHUNK): the module then holds 128 KiB
// of altitudes and at most 20 x 128 KiB of values at once, whatever the batch's length.
const CHUNK = 16384;

// The module's WebAssembly.Memory, for `batchInto`'s views into its buffer (set once, at
// start).
let wasmMemory = null;

export function useMemory(memory) {
  wasmMemory = memory;
}

// `AtmosphereModel.batchInto(altitudesM, outputs, altitudeKind?)`: the core's batch chunk
// by chunk, through one buffer in the module's memory that the model keeps
// (`__batchPrepare`, batch.rs): each chunk's altitudes are copied in through a
// Float64Array view, `__batchRun` writes the columns after them, and each column is
// copied into the caller's Float64Array (`outputs`, keys among the comma-separated
// `stateKeys`). No array is made per chunk or per element. Altitudes given as a plain
// array go through `batch` a chunk at a time (its checks name a non-number element). An
// error names the altitude's index in the whole array.
function batchInto(stateKeys) {
  return function batchInto(altitudesM, outputs, altitudeKind) {
    if (!(altitudesM instanceof Float64Array) && !Array.isArray(altitudesM)) {
      throw typeError("altitudesM", "a Float64Array or an array of numbers", altitudesM);
    }
    const n = altitudesM.length;
    const object = options("outputs", outputs, stateKeys);
    if (object === undefined) throw typeError("outputs", "an object of Float64Arrays", outputs);
    const keys = Object.keys(object);
    if (keys.length === 0) {
      throw new RangeError("outputs lists 0 names; the allowed range is 1 to " + stateKeys.split(",").length);
    }
    const arrays = keys.map((key) => {
      const array = object[key];
      if (!(array instanceof Float64Array)) throw typeError("outputs." + key, "a Float64Array", array);
      if (array.length !== n) {
        throw new RangeError(
          "outputs." + key + " has " + array.length + " elements and altitudesM " + n + "; they must have the same length",
        );
      }
      return array;
    });
    if (altitudesM instanceof Float64Array && wasmMemory !== null) {
      const address = this.__batchPrepare(keys, altitudeKind, Math.min(n, CHUNK));
      for (let start = 0; start < n; start += CHUNK) {
        const count = Math.min(n, start + CHUNK) - start;
        new Float64Array(wasmMemory.buffer, address, count).set(altitudesM.subarray(start, start + count));
        this.__batchRun(count, start);
        // A fresh view: the memory's buffer changes when the module's memory grows.
        const values = new Float64Array(wasmMemory.buffer, address, count * (1 + keys.length));
        for (let j = 0; j < keys.length; j++) arrays[j].set(values.subarray(count * (1 + j), count * (2 + j)), start);
      }
      return outputs;
    }
    for (let start = 0; start < n; start += CHUNK) {
      const end = Math.min(n, start + CHUNK);
      let columns;
      try {
        columns = this.batch(altitudesM.slice(start, end), keys, altitudeKind);
      } catch (e) {
        const place = /^altitudesM\[(\d+)\]/.exec(e.message);
        if (place === null || start === 0) throw e;
        throw new e.constructor("altitudesM[" + (start + Number(place[1])) + "]" + e.message.slice(place[0].length));
      }
      for (let j = 0; j < keys.length; j++) arrays[j].set(columns[keys[j]], start);
    }
    if (n === 0) this.batch([], keys, altitudeKind); // the kind is checked even for no altitudes
    return outputs;
  };
}

export function parseJson(text) {
  return JSON.parse(text);
}

export function describeValue(value) {
  return describe(value);
}

// --- results ---

export function record(keys, values) {
  const names = keys.split(",");
  const out = {};
  for (let i = 0; i < names.length; i++) {
    const v = values[i];
    out[names[i]] = Number.isNaN(v) ? null : v;
  }
  return out;
}

export function columns(keys, values, count) {
  const names = keys.split(",");
  const out = {};
  for (let i = 0; i < names.length; i++) {
    out[names[i]] = values.slice(i * count, (i + 1) * count);
  }
  return out;
}

// The flight summary, from the flat layout `flight.rs` writes (`summary_layout` there):
// samples; the maximum dynamic pressure (present flag, timeS, altitudeM, velocityMS, mach,
// dynamicPressurePa, sampleIndex, refined); the maximum Mach number, drag and q-alpha
// (present flag, value, timeS, altitudeM, velocityMS, sampleIndex, mach); the Mach 1
// crossings up and down (count, firstTimeS, lastTimeS); the maximum q's sampleMaxPa,
// uncertaintyPa, resolved, suggestedSpacingS; machUndefinedSamples, windHeldSamples.
// `extra` (loads.rs, `extras`): the q exceedances (count or -1 when not asked, then six
// numbers each: startTimeS, endTimeS, peak, peakTimeS, openStart, openEnd), the q-alpha
// exceedances likewise, and the q plateau (present flag, startTimeS, endTimeS, maximum,
// fraction, open).
export function flightResult(points, defined, s, extra) {
  const orNull = (v) => (Number.isNaN(v) ? null : v);
  const extreme = (i) =>
    s[i]
      ? { value: s[i + 1], timeS: s[i + 2], altitudeM: s[i + 3], velocityMS: s[i + 4], sampleIndex: s[i + 5], mach: orNull(s[i + 6]) }
      : null;
  const crossings = (i) => ({ count: s[i], firstTimeS: orNull(s[i + 1]), lastTimeS: orNull(s[i + 2]) });
  let at = 0;
  const intervals = () => {
    const n = extra[at++];
    if (n < 0) return undefined;
    const out = [];
    for (let k = 0; k < n; k++, at += 6) {
      out.push({
        startTimeS: extra[at],
        endTimeS: extra[at + 1],
        peak: extra[at + 2],
        peakTimeS: extra[at + 3],
        openStart: extra[at + 4] === 1,
        openEnd: extra[at + 5] === 1,
      });
    }
    return out;
  };
  const qExceedances = intervals();
  const qAlphaExceedances = intervals();
  const p = extra.subarray(at);
  points.defined = defined.slice();
  const summary = {
    samples: s[0],
    maxDynamicPressure: s[1]
      ? {
          timeS: s[2],
          altitudeM: s[3],
          velocityMS: s[4],
          mach: orNull(s[5]),
          dynamicPressurePa: s[6],
          sampleIndex: s[7],
          refined: s[8] === 1,
          sampleMaxPa: s[36],
          uncertaintyPa: orNull(s[37]),
          resolved: s[38] === 1,
          suggestedSpacingS: orNull(s[39]),
        }
      : null,
    maxMach: extreme(9),
    machOneUp: crossings(30),
    machOneDown: crossings(33),
    maxDrag: extreme(16),
    maxQAlpha: extreme(23),
    machUndefinedSamples: s[40],
    windHeldSamples: s[41],
    qPlateau: p[0] ? { startTimeS: p[1], endTimeS: p[2], maximum: p[3], fraction: p[4], open: p[5] === 1 } : null,
  };
  if (qExceedances !== undefined) summary.qExceedances = qExceedances;
  if (qAlphaExceedances !== undefined) summary.qAlphaExceedances = qAlphaExceedances;
  return { points, summary };
}
