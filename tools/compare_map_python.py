#!/usr/bin/env python3
"""Draws a starloom catalogue the way a scientist would with the usual
Python stack (pandas + matplotlib), for a side-by-side timing with
`starloom map`. Run by hand; not part of CI (it needs pandas and
matplotlib).

    python3 tools/compare_map_python.py CATALOGUE.csv OUT.png

It reads the columns the map sheet needs, keeps one row per system (the
primary, as the map marks systems), and draws a top view on an A3
landscape sheet at 300 dpi: discs sized by log luminosity and filled with
each star's colour, with grid and axis labels. No labels, legend or
stalks, so it does less than `starloom map`. Prints the time of each
stage.
"""
import sys
import time

t0 = time.perf_counter()
import numpy as np
import pandas as pd
import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt

t_import = time.perf_counter()
path, out = sys.argv[1], sys.argv[2]
cols = ["id", "system", "name", "x_ly", "y_ly", "z_ly", "kind", "luminosity_lsun", "colour_hex"]
df = pd.read_csv(path, usecols=cols)
t_read = time.perf_counter()
prim = df[df["id"] == df["system"]]
x = prim["x_ly"].to_numpy()
y = prim["y_ly"].to_numpy()
lum = prim["luminosity_lsun"].to_numpy()
size_pt2 = np.clip(1.0 + 0.8 * (np.log10(np.maximum(lum, 1e-6)) + 4.0), 0.3, 12.0) ** 2 * 0.05
colours = prim["colour_hex"].to_numpy()
t_prep = time.perf_counter()
fig = plt.figure(figsize=(420 / 25.4, 297 / 25.4), dpi=300)
ax = fig.add_axes([0.05, 0.05, 0.9, 0.9])
ax.scatter(x, y, s=size_pt2, c=colours, edgecolors="none", rasterized=True)
ax.set_aspect("equal")
ax.grid(True, linewidth=0.3)
ax.set_xlabel("x (ly)")
ax.set_ylabel("y (ly)")
fig.savefig(out, dpi=300)
t_draw = time.perf_counter()
print(f"import     {1e3 * (t_import - t0):8.1f} ms")
print(f"read       {1e3 * (t_read - t_import):8.1f} ms  ({len(df)} rows)")
print(f"prepare    {1e3 * (t_prep - t_read):8.1f} ms  ({len(prim)} systems)")
print(f"draw+save  {1e3 * (t_draw - t_prep):8.1f} ms")
print(f"total      {1e3 * (t_draw - t0):8.1f} ms")
