// The package's two parts behind one API. The default module (aerostrata_bg.wasm beside
// the entry, its glue in lite/) holds what most pages need: the standard atmosphere, the
// batch, the catalogue, point loads. The full module (full/) holds everything: user
// models and soundings, flight scans, winds, compressible flow, airspeeds, altimetry, the
// readers of values and files. A page loads it with `await loadFull()`; until then its
// functions throw an Error that says so. The upper atmosphere's tables (`loadUpper`) go
// into whichever modules are loaded.
//
// Both modules are built from the same crate (bindings/wasm, with and without its `full`
// feature), so a function the lite module has gives the full module's bits. The two
// share neither memory nor objects, so an object the lite module made (a standard model)
// is made again in the full module, from the same arguments, the first time a method
// only the full module has is called on it.
//
// The package's entry (aerostrata.js, written by `cargo xtask wasm` from the exports of
// both builds, crates/xtask/src/wasm/facade.rs) calls `parts` once and exports what it
// gives. Plain `export function` declarations only: the xtask turns this file into
// CommonJS for the Node build by rewriting exactly those (and `import.meta.url`).

const UPPER_FILE = "aerostrata_upper.bin";
const FULL_FILE = "full/aerostrata_bg.wasm";

function isNode() {
  return typeof process !== "undefined" && process.versions != null && process.versions.node != null;
}

function describe(source) {
  if (source === null) return "null";
  if (Array.isArray(source)) return "an array";
  if (typeof source === "number") return "the number " + source;
  return "a " + typeof source;
}

// `lite`: the lite module's exports. `openFull(source)`: a promise of the full module's
// exports, instantiated from `source` (a Response or bytes; the Node build reads its own
// file and is given no source). `where`: the default files' URLs, `{full, upper}`, given
// literally beside `import.meta.url` in the entry so that bundlers ship them. `node`:
// whether this is the Node build.
export function parts(lite, openFull, where, node) {
  let full = null;
  let fullLoading = null;
  let upperFile = null;
  let upperLoading = null;

  function needFull(place) {
    if (full === null) {
      throw new Error(
        place + " is in the full part of the module, which is not loaded: call `await loadFull()` first " +
          "(it loads " + FULL_FILE + " beside the package's entry; the default module has the standard " +
          "atmosphere, the batch, the catalogue and point loads)",
      );
    }
    return full;
  }

  function loadFull(source) {
    if (full !== null) return Promise.resolve();
    if (source === undefined && fullLoading !== null) return fullLoading;
    const loading = (async () => {
      let given;
      if (node) {
        if (source !== undefined) {
          throw new TypeError("loadFull takes no source in Node: the Node build reads node/" + FULL_FILE + " itself");
        }
      } else {
        given = await partSource(source === undefined ? where.full : source, "loadFull", FULL_FILE, true);
      }
      const module = await openFull(given);
      if (upperFile !== null) module.AtmosphereModel.__loadUpper(upperFile);
      full = module;
    })();
    if (source === undefined) {
      fullLoading = loading;
      loading.catch(() => {
        fullLoading = null;
      });
    }
    return loading;
  }

  function loadUpper(source) {
    if (lite.upperLoaded()) return Promise.resolve();
    if (source === undefined && upperLoading !== null) return upperLoading;
    const loading = partSource(source === undefined ? where.upper : source, "loadUpper", UPPER_FILE, false).then(
      (bytes) => {
        lite.AtmosphereModel.__loadUpper(bytes);
        upperFile = bytes;
        if (full !== null) full.AtmosphereModel.__loadUpper(bytes);
      },
    );
    if (source === undefined) {
      upperLoading = loading;
      loading.catch(() => {
        upperLoading = null;
      });
    }
    return loading;
  }

  // A function: the lite module's when it has it, else the full module's once loaded.
  function fn(name, inLite) {
    return inLite
      ? (...args) => lite[name](...args)
      : (...args) => needFull(name + "()")[name](...args);
  }

  // A class over the two modules' classes of the same name. `spec`: `what` (a word for
  // its objects in messages), `ctor` (whether it has a constructor and whether the lite
  // module has it: true, false, or null for none), `statics`, `methods` and `getters`
  // (each name mapped to whether the lite module has it).
  function cls(name, spec) {
    const inner = new WeakMap();
    const article = /^[AEIOU]/.test(name) ? "an " : "a ";
    const WRAP = {};

    function own(self, place) {
      const s = self !== null && typeof self === "object" ? inner.get(self) : undefined;
      if (s === undefined) throw new TypeError(place + ": called on something that is not " + article + name);
      return s;
    }
    // The object of the full module behind `s`: its own, or one made again from the
    // arguments that made the lite module's.
    function inFull(s, place) {
      if (s.freed) throw new Error(place + ": this " + spec.what + " was freed (its free() was called); make a new one");
      if (s.full) return s.object;
      const module = needFull(place);
      if (s.twin === null) {
        const [how, args] = s.recipe;
        s.twin = how === "new" ? new module[name](...args) : module[name][how](...args);
      }
      return s.twin;
    }
    function wrap(object, isFull, recipe) {
      return new Facade(WRAP, object, isFull, recipe);
    }
    // Arguments a lite object was made from, kept for making it again: numbers and strings
    // as they are, arrays copied (the caller may change theirs afterwards).
    function keep(args) {
      return args.map((a) => (ArrayBuffer.isView(a) ? a.slice() : Array.isArray(a) ? a.slice() : a));
    }
    // The lite module makes what it can, also once the full module is loaded, so that
    // what it has is always served the same way (the full module would give the same bits).
    function make(how, inLite, args, place) {
      const module = inLite ? lite : needFull(place);
      const object = how === "new" ? new module[name](...args) : module[name][how](...args);
      return wrap(object, !inLite, inLite ? [how, keep(args)] : null);
    }

    class Facade {
      constructor(...args) {
        if (args[0] === WRAP) {
          inner.set(this, { object: args[1], full: args[2], recipe: args[3], twin: null, freed: false });
          return;
        }
        if (spec.ctor === null) {
          throw new TypeError(name + " has no constructor: make one with its static methods (" + Object.keys(spec.statics).join(", ") + ")");
        }
        const made = make("new", spec.ctor, args, "new " + name + "()");
        inner.set(this, inner.get(made));
      }

      free() {
        const s = own(this, name + ".free()");
        if (s.freed) return;
        s.freed = true;
        s.object.free();
        if (s.twin !== null) s.twin.free();
      }

      [Symbol.dispose]() {
        this.free();
      }

      // wasm-bindgen's field for the object's memory, 0 once freed, which the modules'
      // own readers of objects (a WindProfile among scanFlight's options) look at.
      get __wbg_ptr() {
        const s = own(this, name);
        return s.freed ? 0 : s.object.__wbg_ptr;
      }
    }
    Object.defineProperty(Facade, "name", { value: name });

    for (const [key, inLite] of Object.entries(spec.statics)) {
      const place = name + "." + key + "()";
      Object.defineProperty(Facade, key, {
        value: function (...args) {
          return make(key, inLite, args, place);
        },
        writable: true,
        configurable: true,
      });
    }
    for (const [key, inLite] of Object.entries(spec.methods)) {
      const place = name + "." + key + "()";
      Object.defineProperty(Facade.prototype, key, {
        value: function (...args) {
          const s = own(this, place);
          // The object's own module when it has the method (a freed object throws there).
          if (inLite || s.full) return s.object[key](...args);
          return inFull(s, place)[key](...args);
        },
        writable: true,
        configurable: true,
      });
    }
    for (const [key, inLite] of Object.entries(spec.getters)) {
      const place = name + "." + key;
      Object.defineProperty(Facade.prototype, key, {
        get() {
          const s = own(this, place);
          return inLite || s.full ? s.object[key] : inFull(s, place)[key];
        },
        configurable: true,
      });
    }
    return Facade;
  }

  return {
    fn,
    cls,
    loadFull,
    fullLoaded: () => full !== null,
    loadUpper,
  };
}

// What a part is loaded from: bytes as they are; a Response, checked; a URL or a path
// read (Node) or fetched (browsers and bundlers). `response`: a fetched Response is
// returned as it is (the module compiles while it downloads) rather than read to bytes.
async function partSource(source, who, file, response) {
  if (source instanceof Uint8Array) return source;
  if (source instanceof ArrayBuffer) return new Uint8Array(source);
  if (response && typeof WebAssembly !== "undefined" && source instanceof WebAssembly.Module) return source;
  if (typeof Response !== "undefined" && source instanceof Response) return checked(source, "the Response given", who, file, response);
  if (typeof source !== "string" && !(source instanceof URL)) {
    throw new TypeError(
      who + "'s source must be a URL, a string, a Response, a Uint8Array or an ArrayBuffer" +
        (response ? " or a WebAssembly.Module" : "") + ", got " + describe(source),
    );
  }
  const text = String(source);
  if (isNode() && !/^https?:/i.test(text)) return readLocal(text.startsWith("file:") ? new URL(text) : text, who);
  let fetched;
  try {
    fetched = await fetch(source);
  } catch (e) {
    throw new Error(who + ": cannot fetch " + text + ": " + e.message);
  }
  return checked(fetched, text, who, file, response);
}

async function checked(fetched, what, who, file, response) {
  if (!fetched.ok) {
    throw new Error(
      who + ": fetching " + what + " gave HTTP status " + fetched.status + ": serve " + file +
        " beside the package's aerostrata.js, or pass its URL to " + who,
    );
  }
  return response ? fetched : new Uint8Array(await fetched.arrayBuffer());
}

// Node: its file system (the Node build has `require`; the ES-module build asks Node).
async function readLocal(path, who) {
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
    throw new Error(who + ": cannot read " + String(path) + ": " + e.message);
  }
}
