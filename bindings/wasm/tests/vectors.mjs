// The reference vectors of tests/vectors (format: tests/vectors/README.md), read and
// evaluated through the wasm module along the same path as the native reader
// (crates/xtask/src/rust/vectors.rs, `Evaluator`), so that both give the same numbers.

import { readdirSync, readFileSync } from "node:fs";
import { basename, join } from "node:path";

/** One vector file: model, tolerance rules, input column, value columns, rows. */
export function readVectorFile(path) {
  const file = { path, stem: basename(path, ".csv"), model: "", rules: {}, input: "", columns: [], rows: [] };
  readFileSync(path, "utf8")
    .split("\n")
    .forEach((raw, index) => {
      const line = raw.trim();
      if (line === "") return;
      if (line.startsWith("#")) {
        const comment = line.slice(1).trim();
        if (comment.startsWith("model:")) file.model = comment.slice(6).trim();
        else if (comment.startsWith("tolerance:")) {
          const [column, rule, value] = comment.slice(10).trim().split(/\s+/);
          file.rules[column] = rule === "printed" ? { kind: "printed" } : { kind: rule, value: Number(value) };
        }
        return;
      }
      const cells = line.split(",").map((c) => c.trim());
      if (file.columns.length === 0) {
        file.input = cells[0];
        file.columns = cells.slice(1);
      } else {
        if (cells.length !== file.columns.length + 1) throw new Error(`${path}:${index + 1}: wrong cell count`);
        file.rows.push({ line: index + 1, cells });
      }
    });
  if (!file.model) throw new Error(`${path}: no '# model:' line`);
  return file;
}

export function readVectorFiles(dir) {
  return readdirSync(dir)
    .filter((name) => name.endsWith(".csv"))
    .sort()
    .map((name) => readVectorFile(join(dir, name)));
}

/** Half a unit of the last digit of a number as written ("288.150" -> 0.0005). */
export function halfUnitOfLastDigit(written) {
  const [mantissa, exponent] = written.toLowerCase().split("e");
  const decimals = mantissa.includes(".") ? mantissa.split(".")[1].length : 0;
  return 0.5 * 10 ** ((exponent === undefined ? 0 : Number(exponent)) - decimals);
}

/**
 * The catalogue's quantities by their SI column name (`temperature_K`), as the module
 * itself lists them: the vector files name their columns so.
 */
export function columnsOf(aerostrata) {
  return new Map(aerostrata.quantities().map((q) => [q.siColumn, q]));
}

function parameter(words, prefix, fallback) {
  const word = words.find((w) => w.startsWith(prefix));
  return word === undefined ? fallback : Number(word.slice(prefix.length));
}

/**
 * A function from a row's input to a function from a column name to its value (a
 * number, or `undefined` where the model does not define it), for `file`'s model.
 */
export function evaluator(aerostrata, file) {
  const words = file.model.split(/\s+/);
  const kind = words[0];
  if (kind === "us1976" || kind === "hydrostatic_offset") {
    const columns = columnsOf(aerostrata);
    const offset = parameter(words, "offset=", 0);
    const model =
      kind === "us1976"
        ? aerostrata.AtmosphereModel.standard(offset)
        : aerostrata.AtmosphereModel.hydrostaticOffset(offset, parameter(words, "p0=", 101325));
    const altitudeKind = { geometric_altitude_m: "geometric", geopotential_altitude_m: "geopotential" }[file.input];
    if (!altitudeKind) throw new Error(`${file.path}: unknown input column ${file.input}`);
    return (input) => {
      const state = model.state(input, altitudeKind);
      let species;
      return (column) => {
        const quantity = columns.get(column);
        if (quantity === undefined) throw new Error(`${file.path}: no quantity named ${column}`);
        if (quantity.group === "species") {
          if (species === undefined) {
            try {
              species = aerostrata.standardSpecies(input, altitudeKind);
            } catch (e) {
              // The standard gives species from 86 km up only (as the native reader's
              // `species(...).ok()`).
              if (!(e instanceof RangeError)) throw e;
              species = null;
            }
          }
          return species === null ? undefined : species[quantity.key];
        }
        if (!(quantity.key in state)) throw new Error(`${file.path}: ${column} is not a quantity of the state`);
        return state[quantity.key] ?? undefined;
      };
    };
  }
  const gamma = parameter(words, "gamma=", 1.4);
  if (file.input !== "mach") throw new Error(`${file.path}: unknown input column ${file.input} (expected mach)`);
  const ratios = flowRatios[kind];
  if (ratios === undefined) throw new Error(`${file.path}: unknown model '${file.model}'`);
  return (mach) => {
    const values = ratios(aerostrata, mach, gamma);
    return (column) => {
      if (!(column in values)) throw new Error(`${file.path}: no quantity named ${column}`);
      return values[column];
    };
  };
}

/** The compressible-flow models of the vector files: their columns at a Mach number. */
const flowRatios = {
  isentropic(aerostrata, mach, gamma) {
    const r = aerostrata.isentropic(mach, gamma);
    return {
      p_p0: r.pressureRatio,
      rho_rho0: r.densityRatio,
      t_t0: r.temperatureRatio,
      a_astar: aerostrata.areaRatio(mach, gamma),
      qc_p: aerostrata.impactPressureRatio(mach, gamma),
    };
  },
  normal_shock(aerostrata, mach, gamma) {
    const s = aerostrata.normalShock(mach, gamma);
    return {
      m2: s.downstreamMach,
      p2_p1: s.pressureRatio,
      rho2_rho1: s.densityRatio,
      t2_t1: s.temperatureRatio,
      p02_p01: s.totalPressureRatio,
      p02_p1: s.pitotPressureRatio,
      p1_p02: 1 / s.pitotPressureRatio,
    };
  },
};

const scratch = new Float64Array(1);
const scratchBits = new BigUint64Array(scratch.buffer);

/** The f64 bit pattern of `value` as 16 lower-case hex digits. */
export function bits(value) {
  scratch[0] = value;
  return scratchBits[0].toString(16).padStart(16, "0");
}

/**
 * `FILE INPUT COLUMN BITS` for every value of every row of every file, in the format of
 * `cargo xtask bits` (crates/xtask/src/rust/vectors.rs, `bit_lines`).
 */
export function bitLines(aerostrata, files) {
  const lines = [];
  for (const file of files) {
    const rowOf = evaluator(aerostrata, file);
    for (const { cells } of file.rows) {
      const input = Number(cells[0]);
      if (Number.isNaN(input)) throw new Error(`${file.path}: bad input '${cells[0]}'`);
      const value = rowOf(input);
      for (const column of file.columns) {
        const v = value(column);
        lines.push(`${file.stem} ${cells[0]} ${column} ${v === undefined ? "undefined" : bits(v)}`);
      }
    }
  }
  return lines;
}
