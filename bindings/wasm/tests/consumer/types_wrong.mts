// Must NOT type-check (cargo xtask npm-check expects tsc to fail here, with these
// errors and no others: each `// TSnnnn` comment names the error of the line below it):
// proof that the declarations are read and that a mistake fails.

import { AtmosphereModel, dynamicPressurePa, standardState } from "aerostrata";

// TS2322: a number is not a string.
const pressure: string = standardState(0).pressurePa;
// TS2345: a string where the density in kg/m^3 belongs.
const q = dynamicPressurePa("1.225", 100);
// TS2345: not an altitude kind.
const state = AtmosphereModel.standard().state(0, "pressure");
// TS2531: possibly null (undefined above 86 km) under --strict.
const mach = 300 / standardState(90000).speedOfSoundMS;

export { pressure, q, state, mach };
