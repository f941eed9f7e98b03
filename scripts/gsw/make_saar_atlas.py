#!/usr/bin/python3
"""Write shared/seawater/data/saar-atlas.json: the Absolute Salinity Anomaly Ratio atlas.

Source: the global SAAR atlas of McDougall, Jackett, Millero, Pawlowicz & Barker (2012), "A global
algorithm for estimating Absolute Salinity", Ocean Science 8, 1123-1134, as shipped inside the
TEOS-10 reference library (GSW), read here from Debian's python3-gsw 3.6.16 by evaluating the
library on the atlas's own grid: 4 degree cells from 0 E and 86 S, and 45 pressure levels.

The library interpolates inside a cell from its four corners and, where a corner has no value
(land, or below that column's bottom), replaces it with the mean of the corners that have one.
So a node that has data gives the same value whichever of its four neighbouring cells the library
reads it from, and a node without data gives different (or zero) values. The script keeps a node's
value only where the four agree, and marks it missing otherwise.

The Baltic Sea branch (Feistel, Weinreben et al. 2010, Ocean Science 6, 91-141, in the same
library: SA = (35.16504 - 0.087)/35 * SP + 0.087 g/kg) applies inside a region bounded by a
western and an eastern edge; the script finds those edges at every 0.5 degree of latitude by
bisection on the library's SA_from_SP_Baltic, which is NaN outside the region.

Run: /usr/bin/python3 scripts/gsw/make_saar_atlas.py
"""
import base64
import json
import os

import numpy as np
import gsw

OUT = os.path.join(os.path.dirname(__file__), "..", "..", "shared", "seawater", "data", "saar-atlas.json")

LONGS = np.arange(0.0, 360.0 + 1e-9, 4.0)           # 91 nodes, 0 .. 360 E
LATS = np.arange(-86.0, 90.0 + 1e-9, 4.0)           # 45 nodes, 86 S .. 90 N
# The atlas's pressure levels, dbar (the library's piecewise-linear interpolation in pressure
# has its corners exactly there; the same levels are the pressures of its check casts).
P_LEVELS = np.array([0, 10, 20, 30, 40, 50, 76, 101, 126, 151, 176, 202, 252, 303, 353, 404, 505,
                     606, 707, 808, 909, 1010, 1111, 1213, 1314, 1416, 1517, 1771, 2025, 2279, 2534,
                     2789, 3045, 3300, 3556, 3812, 4069, 4325, 4583, 4840, 5098, 5355, 5614, 5872,
                     6131], dtype=float)
EPS = 1e-9  # degrees: enough to fall in the neighbouring cell, too little to change a value by 1e-13


def cell_deepest_levels():
    """Per 4-degree cell, the deepest atlas level the library reads there (-1 for an all-land
    cell): below it the library holds the ratio constant, so that is where the values stop
    changing with pressure."""
    clon, clat = np.meshgrid(LONGS[:-1] + 2.0, LATS[:-1] + 2.0, indexing="xy")
    by_level = np.stack([np.asarray(gsw.SAAR(pk + 0 * clon, clon, clat), dtype=float) for pk in P_LEVELS])
    deep = np.asarray(gsw.SAAR(20000.0 + 0 * clon, clon, clat), dtype=float)
    deepest = np.full(clon.shape, -1, dtype=int)
    for k in range(len(P_LEVELS) - 1, -1, -1):
        still = by_level[k] == deep
        deepest = np.where((deepest == -1) & ~still, k + 1, deepest)
    deepest = np.where(deepest == -1, 0, deepest)
    deepest = np.minimum(deepest, len(P_LEVELS) - 1)
    land = ~np.isfinite(deep) | ((deep == 0.0) & np.all(by_level == 0.0, axis=0))
    return np.where(land, -1, deepest)


def atlas_values(deepest):
    """SAAR at every (level, lat, lon) node; NaN where the node has no data.

    A node with data gives the same value from every neighbouring cell that reads that level
    (cells whose deepest level is shallower hold an older value); a node without data gets each
    cell's own mean of its other corners, which differ."""
    ny, nx = len(LATS), len(LONGS)
    values = np.full((len(P_LEVELS), ny, nx), np.nan)
    lon2, lat2 = np.meshgrid(LONGS, LATS, indexing="xy")
    # The four cells around a node, as offsets of the node towards each cell's interior.
    cells = ((0, 0, EPS, EPS), (-1, 0, -EPS, EPS), (0, -1, EPS, -EPS), (-1, -1, -EPS, -EPS))
    for k, pk in enumerate(P_LEVELS):
        readings, usable = [], []
        for dx, dy, ex, ey in cells:
            cx = (np.arange(nx)[None, :] + dx) % (nx - 1)
            cy = np.arange(ny)[:, None] + dy
            ok_y = (cy >= 0) & (cy < ny - 1)
            cyc = np.clip(cy, 0, ny - 2)
            lo = np.mod(lon2 + ex, 360.0)
            la = np.clip(lat2 + ey, LATS[0], LATS[-1])
            readings.append(np.asarray(gsw.SAAR(pk + 0 * lo, lo, la), dtype=float))
            usable.append(ok_y & (deepest[cyc, cx] >= k))
        readings, usable = np.stack(readings), np.stack(usable)
        ref = np.nanmax(np.where(usable, readings, -np.inf), axis=0)
        count = usable.sum(axis=0)
        agree = np.all(~usable | (np.abs(readings - ref) <= 1e-12 + 1e-9 * np.abs(ref)), axis=0)
        values[k] = np.where((count >= 1) & agree & np.isfinite(ref) & (ref != 0.0), ref, np.nan)
    return values


def baltic_edges():
    """Western and eastern edge (deg E) of the Baltic branch at each 0.5 deg of latitude."""
    lats = np.arange(50.0, 69.0 + 1e-9, 0.5)
    inside = lambda lon, lat: np.isfinite(gsw.SA_from_SP_Baltic(7.0, lon, lat))
    rows = []
    for lat in lats:
        probe = np.arange(0.0, 45.0, 0.05)
        mask = np.isfinite(np.asarray(gsw.SA_from_SP_Baltic(7.0 + 0 * probe, probe, lat + 0 * probe), dtype=float))
        if not mask.any():
            continue
        i0, i1 = np.argmax(mask), len(mask) - 1 - np.argmax(mask[::-1])

        def bisect(a, b, a_inside):
            for _ in range(60):
                m = 0.5 * (a + b)
                if inside(m, lat) == a_inside:
                    a = m
                else:
                    b = m
            return 0.5 * (a + b)

        west = bisect(probe[i0], probe[i0] - 0.05, True) if i0 > 0 else probe[0]
        east = bisect(probe[i1], probe[i1] + 0.05, True)
        rows.append([float(lat), round(west, 9), round(east, 9)])
    return rows


def main():
    deepest = cell_deepest_levels()
    values = atlas_values(deepest)
    packed = values.astype("<f8").tobytes()
    doc = {
        "source": "Global Absolute Salinity Anomaly Ratio atlas, McDougall, Jackett, Millero, Pawlowicz & Barker (2012), Ocean Science 8, 1123-1134; Baltic branch of Feistel et al. (2010), Ocean Science 6, 91-141",
        "read_from": "TEOS-10 GSW Oceanographic Toolbox, Debian package python3-gsw %s (gsw.SAAR, gsw.SA_from_SP_Baltic)" % gsw.__version__,
        "generated_by": "scripts/gsw/make_saar_atlas.py",
        "units": "SAAR is unitless (SA = SR * (1 + SAAR)); lon deg E, lat deg N, p dbar",
        "longitudes": {"first": float(LONGS[0]), "step": 4.0, "count": len(LONGS)},
        "latitudes": {"first": float(LATS[0]), "step": 4.0, "count": len(LATS)},
        "pressures": P_LEVELS.tolist(),
        "layout": "float64 little-endian, index = (level * latitudes.count + lat) * longitudes.count + lon; NaN where the node has no value",
        "saar_base64": base64.b64encode(packed).decode("ascii"),
        "cell_deepest_level": {
            "meaning": "per 4-degree cell, the index of the deepest level the library reads (-1: no value in the cell); below it the ratio is held constant",
            "layout": "index = lat_cell * (longitudes.count - 1) + lon_cell",
            "values": deepest.ravel().tolist(),
        },
        "baltic": {
            "formula": "SA = (35.16504 - 0.087) / 35 * SP + 0.087 g/kg",
            "edges": "[lat, western lon, eastern lon] every 0.5 deg; inside when west <= lon <= east, edges interpolated linearly in latitude",
            "rows": baltic_edges(),
        },
    }
    os.makedirs(os.path.dirname(OUT), exist_ok=True)
    with open(OUT, "w") as f:
        json.dump(doc, f, indent=1)
        f.write("\n")
    n_ok = int(np.isfinite(values).sum())
    print("wrote %s: %d of %d nodes with values" % (os.path.normpath(OUT), n_ok, values.size))


if __name__ == "__main__":
    main()
