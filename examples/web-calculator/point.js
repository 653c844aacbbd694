// The numbers of one point: the air at an altitude in the chosen model and the loads on
// a body moving through it, every one from the module (its state, dynamic pressure,
// drag, Mach and Reynolds numbers). Shared by the page, which runs it for the models a
// spec names, and its worker, which runs it for an uploaded sounding (whose model lives
// off the page's thread), so that both give the same numbers the same way.

/**
 * Whether the point at geometric `altitudeM`, or its profile (up to 1.3 times as high),
 * needs the upper atmosphere (above 86 km), whose tables the module loads on first need
 * (`loadUpper`): the page and its worker fetch them before computing such a point.
 */
export function reachesUpper(altitudeM) {
  return Math.max(altitudeM, 1.3 * altitudeM) > UPPER_BASE_M;
}

/** Where the upper atmosphere begins, geometric m (the 1976 standard's 86 km). */
export const UPPER_BASE_M = 86000;

/** The state quantities of the profile chart, by the module's keys, and its altitudes. */
export const PROFILE_KEYS = ["temperatureK", "pressurePa", "densityKgM3"];
const PROFILE_POINTS = 241;

/**
 * The point's numbers in `model` (an `AtmosphereModel`) with the module's functions in
 * `api`. `inputs`: `{altitudeM, speedKind: "velocity" | "mach", velocityMS, mach, cd,
 * areaM2, lengthM}`, all SI. Returns `{ok: true, state, loads, profile}` or, for input
 * the module refuses, `{ok: false, field, message}` naming the field at fault.
 */
export function computePoint(api, model, inputs) {
  const fail = (field, e) => ({ ok: false, field, message: e instanceof Error ? e.message : String(e) });
  let s;
  try {
    s = model.state(inputs.altitudeM);
  } catch (e) {
    return fail("altitude", e);
  }
  const a = s.speedOfSoundMS;
  let velocity;
  let mach = null;
  let q;
  try {
    if (inputs.speedKind === "mach") {
      if (a === null) {
        return fail("mach", "A Mach number needs a speed of sound, which this model does not define at this altitude.");
      }
      // q = gamma p M^2 / 2 and the true airspeed V = M a, both from the module.
      q = api.dynamicPressureFromMachPa(s.pressurePa, inputs.mach);
      velocity = api.velocityFromMachMS(inputs.mach, a);
      mach = inputs.mach;
    } else {
      velocity = inputs.velocityMS;
      q = api.dynamicPressurePa(s.densityKgM3, velocity);
      if (a !== null) mach = api.machNumber(velocity, a);
    }
  } catch (e) {
    return fail(inputs.speedKind === "mach" ? "mach" : "velocity", e);
  }
  let drag;
  try {
    drag = api.dragN(q, inputs.cd, inputs.areaM2);
  } catch (e) {
    // dragN names the quantity it refuses; the message goes where that quantity is typed.
    return fail(/area/.test(e.message) ? "area" : "cd", e);
  }
  let reynolds = null;
  if (s.dynamicViscosityPaS !== null) {
    try {
      reynolds = api.reynoldsNumber(s.densityKgM3, velocity, inputs.lengthM, s.dynamicViscosityPaS);
    } catch (e) {
      return fail("length", e);
    }
  }
  return {
    ok: true,
    state: s,
    loads: { dynamicPressurePa: q, dragN: drag, mach, reynoldsNumber: reynolds, velocityMS: velocity },
    profile: profile(model, s.geometricAltitudeM),
  };
}

/**
 * The profile around altitude `z`: from the ground (or below, down to the point) to
 * 20 km or 1.3 z, within the model's range. `null` where the model cannot give the
 * chart's quantities over that band (the chart is then left out, the numbers stand).
 */
function profile(model, z) {
  const range = model.range();
  const bottom = Math.max(range.geometricMinM, Math.min(0, z));
  const top = Math.min(range.geometricMaxM, Math.max(20000, 1.3 * z));
  if (!(top > bottom)) return null;
  const altitudesM = Float64Array.from({ length: PROFILE_POINTS }, (_, i) => bottom + ((top - bottom) * i) / (PROFILE_POINTS - 1));
  try {
    return { altitudesM, columns: model.batch(altitudesM, PROFILE_KEYS) };
  } catch {
    return null;
  }
}
