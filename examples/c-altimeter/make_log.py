#!/usr/bin/env python3
"""Writes flight_log.csv: an invented barometer log for the c-altimeter example.

The vehicle, the site and the flight are invented for this demonstration: the
"Moravin 38" test rocket (1.60 kg at lift-off, 0.42 kg of propellant burnt at a
constant 150 N for 2.1 s, Cd 0.55 on a 38 mm body) flown from an invented pad at
412 m above sea level on a standard day, a drogue opening 1.5 s after apogee.
The trajectory is a plain vertical point-mass integration (Euler, 1 ms steps),
the air that of the U.S. Standard Atmosphere 1976 troposphere (its defining
formula, p = p0 (1 - L H / T0)^(g0 M0 / (R* L)), with H the geopotential
altitude), and the barometer reads every 50 ms with Gaussian noise of 3 Pa from
a fixed seed. The true apogee and maximum dynamic pressure are written as
comment lines so that the example's test can check what the program finds.

    python3 make_log.py > flight_log.csv
"""

import math
import random

# U.S. Standard Atmosphere 1976, troposphere constants (the standard's Table 4 and
# its defining constants).
T0, P0, L, G0, R_STAR, M0, R0 = 288.15, 101325.0, 0.0065, 9.80665, 8314.32, 28.9644, 6356766.0

PAD_M = 412.0
MASS0, PROPELLANT, THRUST, BURN = 1.60, 0.42, 150.0, 2.1
CD, AREA = 0.55, math.pi * 0.019**2
DROGUE_DELAY, DESCENT_M_S = 1.5, 18.0
DT, SAMPLE, NOISE_PA = 0.001, 0.05, 3.0


def air(z_m):
    h = R0 * z_m / (R0 + z_m)
    t = T0 - L * h
    p = P0 * (t / T0) ** (G0 * M0 / (R_STAR * L))
    return p, p * M0 / (R_STAR * t)


def main():
    rng = random.Random(1976)
    t, z, v = 0.0, 0.0, 0.0
    apogee = None
    max_q = (0.0, 0.0)
    rows = []
    step = 0
    for k in range(-40, 0):  # two seconds on the pad
        rows.append((k * SAMPLE, air(PAD_M)[0]))
    while True:
        if step % round(SAMPLE / DT) == 0:
            rows.append((t, air(PAD_M + z)[0]))
        if apogee is not None and t > apogee[0] + DROGUE_DELAY + 6.0:
            break
        p, rho = air(PAD_M + z)
        q = 0.5 * rho * v * v
        if q > max_q[1]:
            max_q = (t, q)
        if apogee is not None and t >= apogee[0] + DROGUE_DELAY:
            v = max(v - G0 * DT, -DESCENT_M_S)
        else:
            burning = t < BURN
            mass = MASS0 - PROPELLANT * min(t, BURN) / BURN
            drag = q * CD * AREA * (1.0 if v >= 0 else -1.0)
            a = ((THRUST if burning else 0.0) - drag) / mass - G0
            if v > 0 and v + a * DT <= 0 and apogee is None:
                apogee = (t + v / -a, z + v * v / (-2 * a))
            v += a * DT
        z += v * DT
        t += DT
        step += 1
    print("# Invented barometer log of the invented Moravin 38 test rocket (see make_log.py).")
    print(f"# pad: {PAD_M:.1f} m above sea level, standard day; noise {NOISE_PA} Pa (seed 1976)")
    print(f"# true apogee: {apogee[1]:.2f} m above the pad at t = {apogee[0]:.3f} s")
    print(f"# true maximum dynamic pressure: {max_q[1]:.1f} Pa at t = {max_q[0]:.3f} s")
    print("time_s,pressure_Pa")
    for time_s, p in rows:
        print(f"{time_s:.2f},{p + rng.gauss(0.0, NOISE_PA):.2f}")


if __name__ == "__main__":
    main()
