#!/usr/bin/env python3
"""Fills a box with stars the way a scientist would with the usual Python
stack (NumPy + pandas), for a side-by-side timing with `starloom
populate`. Run by hand; not part of CI (it needs NumPy and pandas).

    python3 tools/compare_populate_python.py STARS OUT.csv

It draws STARS positions uniformly in a cube, masses from a two-part
power law, ages uniform over 0-10 Gyr, and derives luminosity, radius,
temperature, lifetime, habitable-zone edges and absolute magnitude with
textbook power laws (common practice, no source), then writes the same
number of columns as a starloom catalogue with pandas. The physics is a
sketch for timing only: no evolution, remnants, multiplicity, classes or
colours from spectra, so it does much less than `starloom populate`.
"""
import sys
import time

t0 = time.perf_counter()
import numpy as np
import pandas as pd

n, out = int(sys.argv[1]), sys.argv[2]
rng = np.random.default_rng(1)
t_import = time.perf_counter()
edge = (n / 0.0025) ** (1 / 3)
xyz = rng.uniform(-edge / 2, edge / 2, size=(n, 3))
# Inverse CDF of a two-part power law (slopes 1.3 below and 2.3 above
# 0.5 Msun, 0.08-150 Msun).
def powerlaw(u, lo, hi, a):
    e = 1 - a
    return (lo**e + u * (hi**e - lo**e)) ** (1 / e)
u = rng.uniform(size=n)
low = rng.uniform(size=n) < 0.79
mass = np.where(low, powerlaw(u, 0.08, 0.5, 1.3), powerlaw(u, 0.5, 150, 2.3))
age = rng.uniform(0, 10, size=n)
lum = np.where(mass < 0.43, 0.23 * mass**2.3, mass**4)
radius = np.where(mass < 1, mass**0.8, mass**0.57)
teff = 5772 * (lum / radius**2) ** 0.25
life = 10 * mass**-2.5
hz_in = np.sqrt(lum / 1.1)
hz_out = np.sqrt(lum / 0.53)
absmag = 4.83 - 2.5 * np.log10(lum)
kind = np.where(age > life, "white-dwarf", "main-sequence")
letters = np.array(list("MKGFAB"))
cls = letters[np.searchsorted([3900, 5300, 6000, 7300, 10000], teff)]
colour = np.where(teff < 4000, "#ffc486", "#fff4ea")
ids = np.arange(n, dtype=np.uint64) * 16 + 9213660993389527040
t_gen = time.perf_counter()
df = pd.DataFrame({
    "id": ids, "system": ids, "designation": ids.astype(str),
    "name": np.char.add("Star", np.arange(n).astype(str)),
    "x_ly": xyz[:, 0], "y_ly": xyz[:, 1], "z_ly": xyz[:, 2],
    "kind": kind, "class": cls, "mass_msun": mass, "initial_mass_msun": mass,
    "radius_rsun": radius, "luminosity_lsun": lum, "teff_k": teff,
    "age_gyr": age, "lifetime_gyr": life, "hz_inner_au": hz_in,
    "hz_outer_au": hz_out, "colour_hex": colour, "abs_mag_v": absmag,
    "separation_au": 0.0, "period_days": 0.0, "habitable_host": False,
    "origin": "generated",
})
df.to_csv(out, index=False)
t_write = time.perf_counter()
print(f"import     {1e3 * (t_import - t0):8.1f} ms")
print(f"generate   {1e3 * (t_gen - t_import):8.1f} ms")
print(f"write      {1e3 * (t_write - t_gen):8.1f} ms  ({n} rows)")
print(f"total      {1e3 * (t_write - t0):8.1f} ms")
