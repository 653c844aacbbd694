// A TypeScript consumer of the installed package's declarations, checked by
// `tsc --strict --noEmit` (cargo xtask npm-check): the Node entry and the web entry.

import { AtmosphereModel, dynamicPressurePa, fullLoaded, loadFull, loadUpper, parseValue, standardState, upperLoaded } from "aerostrata";
import type { AltitudeKind, AtmosphereState, StateQuantity } from "aerostrata";
import init, { standardState as webStandardState } from "aerostrata/web";

const kind: AltitudeKind = "geopotential";
const sea: AtmosphereState = standardState(0, kind);
const pressurePa: number = sea.pressurePa;
// Undefined above 86 km: the type says so, and strict mode makes the reader check.
const speed: number | null = sea.speedOfSoundMS;
const q: number = dynamicPressurePa(sea.densityKgM3, speed === null ? 0 : 0.8 * speed);

const model: AtmosphereModel = AtmosphereModel.standard(15);
const wanted: StateQuantity[] = ["temperatureK", "densityKgM3"];
const columns: Record<StateQuantity, Float64Array> = model.batch(new Float64Array([0, 1000]), wanted);
const firstTemperatureK: number | undefined = columns.temperatureK[0];
model.free();

export async function high(): Promise<number> {
  const loading: Promise<void> = loadUpper();
  await loading;
  await loadUpper(new Uint8Array(0));
  const loaded: boolean = upperLoaded();
  return loaded ? standardState(120000).temperatureK : Number.NaN;
}

export async function everything(): Promise<number> {
  const loading: Promise<void> = loadFull();
  await loading;
  const loaded: boolean = fullLoaded();
  return loaded ? parseValue("15 C", "temperature").si : Number.NaN;
}

export async function onThePage(): Promise<number> {
  await init();
  return webStandardState(5000).temperatureK;
}

export const checked: number[] = [pressurePa, q, firstTemperatureK ?? Number.NaN];
