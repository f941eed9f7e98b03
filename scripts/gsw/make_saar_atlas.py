#!/usr/bin/python3
"""Write shared/seawater/data/saar-atlas.json: the Absolute Salinity Anomaly Ratio atlas.

Source: the global SAAR atlas of McDougall, Jackett, Millero, Pawlowicz & Barker (2012), "A global
algorithm for estimating Absolute Salinity", Ocean Science 8, 1123-1134, as shipped inside the
TEOS-10 reference library (GSW), read here from Debian's python3-gsw 3.6.16 by evaluating the
library on the atlas's own grid: 4 degree cells from 0 E and 86 S, and 45 pressure levels.

The library interpolates inside a cell from its four corners and, where a corner has no value
(land, or below that column's bottom), replaces it with the mean of the corners that have one, or
with 0 where no corner at that level has one. So a node that has data gives the same value
whichever of its neighbouring cells the library reads it from, and a node without data gives
different (or zero) values. The script keeps a node's value only where they agree, and marks it
missing otherwise. The columns at 0 E and 360 E are kept apart: the library's differ.

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


def _cell_probe(p, cx, cy, r, s):
    """gsw.SAAR at fraction (r, s) of every cell (cx, cy), at pressure p (scalar or per-cell array)."""
    lon = LONGS[cx] + 4.0 * r
    lat = LATS[cy] + 4.0 * s
    return np.asarray(gsw.SAAR(p + 0 * lon, lon, lat), dtype=float)


# Points inside a cell where its value is read, as fractions of the cell (none on a node or edge).
PROBES = ((0.5, 0.5), (0.25, 0.3), (0.7, 0.8), (0.85, 0.15))


def cell_deepest_levels():
    """Per 4-degree cell, the index of the deepest atlas level the library reads there (-1: the
    library answers 0 everywhere in the cell, i.e. no corner has data).

    The library holds the pressure at the deepest level of the deepest of the cell's four corners,
    so between that level and the one above it the value still changes with pressure, and below it
    it does not: the deepest level is the last k for which a pressure between levels k-1 and k reads
    a value different from a pressure far below the atlas, at any of the probe points."""
    cx, cy = np.meshgrid(np.arange(len(LONGS) - 1), np.arange(len(LATS) - 1), indexing="xy")
    deepest = np.zeros(cx.shape, dtype=int)
    anything = np.zeros(cx.shape, dtype=bool)
    for r, s in PROBES:
        deep = _cell_probe(20000.0, cx, cy, r, s)
        for k in range(len(P_LEVELS)):
            at = _cell_probe(P_LEVELS[k], cx, cy, r, s)
            anything |= at != 0.0
            if k >= 1:
                mid = _cell_probe(0.5 * (P_LEVELS[k - 1] + P_LEVELS[k]), cx, cy, r, s)
                deepest = np.where(mid != deep, np.maximum(deepest, k), deepest)
    return np.where(anything, deepest, -1)


# The Isthmus of Panama as the library draws it (deg E, deg N). Inside the box it spans, the
# library counts only the corners on the point's side of the line (McDougall et al. 2012, sec. 3).
# The nodes are the library's: the jump in its values across the line, found by bisection at
# 261-286 E, lies on these segments to 1e-6 deg (the last node is 292 E, 3.4 N).
PANAMA_LON = np.array([260.0, 272.59, 276.5, 278.65, 280.73, 292.0])
PANAMA_LAT = np.array([19.55, 13.97, 9.6, 8.1, 9.33, 3.4])


def panama_line(lon):
    """Latitude of the line at lon: straight between its nodes, extended along the end segments."""
    k = np.clip(np.searchsorted(PANAMA_LON, lon, side="left") - 1, 0, len(PANAMA_LON) - 2)
    w = (lon - PANAMA_LON[k]) / (PANAMA_LON[k + 1] - PANAMA_LON[k])
    return PANAMA_LAT[k] + w * (PANAMA_LAT[k + 1] - PANAMA_LAT[k])


def in_panama_box(lon, lat):
    return (lon >= PANAMA_LON[0]) & (lon <= PANAMA_LON[-1] - 0.001) & (lat >= PANAMA_LAT[-1]) & (lat <= PANAMA_LAT[0])


def atlas_values(deepest):
    """SAAR at every (level, lat, lon) node; NaN where the node has no data.

    Every node is read from each of the (up to four) cells it is a corner of, at the node itself
    or a hair inside the cell, and only from cells that read that level (whose deepest level is at
    or below it). Nodes are never shared across the 0/360 E seam: the library keeps two columns
    there (0 E and 360 E) that differ, and a point just west of the seam reads the 360 E one.
    A node with data gives the same value from every such cell (the bilinear form reproduces a
    corner exactly); a node without data gives each cell's own mean of its corners with data (or
    0 where none has data), which differ between cells. A node kept where the cells agree by
    chance, or where a single cell reads it, changes nothing: in that cell the value kept is the
    mean the library would put there."""
    ny, nx = len(LATS), len(LONGS)
    values = np.full((len(P_LEVELS), ny, nx), np.nan)
    lon2, lat2 = np.meshgrid(LONGS, LATS, indexing="xy")
    ii, jj = np.meshgrid(np.arange(nx), np.arange(ny), indexing="xy")
    # The four cells around a node: offset of the cell index, and the nudge into the cell.
    cells = ((0, 0, EPS, EPS), (-1, 0, -EPS, EPS), (0, -1, EPS, -EPS), (-1, -1, -EPS, -EPS))
    for k, pk in enumerate(P_LEVELS):
        readings, usable = [], []
        for dx, dy, ex, ey in cells:
            cx, cy = ii + dx, jj + dy
            ok = (cx >= 0) & (cx < nx - 1) & (cy >= 0) & (cy < ny - 1)
            cxc, cyc = np.clip(cx, 0, nx - 2), np.clip(cy, 0, ny - 2)
            if dx == 0 and dy == 0:
                lo, la = lon2, lat2  # the node itself: the library reads its corner exactly
            else:
                lo, la = lon2 + ex, lat2 + ey
            lo = np.clip(lo, 0.0, 360.0 - 1e-9)
            la = np.clip(la, LATS[0], LATS[-1])
            readings.append(np.asarray(gsw.SAAR(pk + 0 * lo, lo, la), dtype=float))
            # inside the Panama box the library reads corners by side of the line: not a node's value
            usable.append(ok & (deepest[cyc, cxc] >= k) & ~in_panama_box(lo, la))
        readings, usable = np.stack(readings), np.stack(usable)
        first = np.argmax(usable, axis=0)
        ref = np.take_along_axis(readings, first[None], axis=0)[0]
        count = usable.sum(axis=0)
        agree = np.all(~usable | (np.abs(readings - ref) <= 1e-12 + 1e-9 * np.abs(ref)), axis=0)
        values[k] = np.where((count >= 1) & agree & np.isfinite(ref), ref, np.nan)
    return values


def panama_cells(deepest):
    """Inside the Panama box a cell reads different corners on either side of the line, so the
    corner values of every cell the box touches are kept per level and side (above the line, below
    it, and outside the box): fitted (least squares on the bilinear form, exact to rounding) to the
    library's values at points of that part of the cell."""
    out = []
    grid = np.linspace(0.04, 0.96, 24)
    rr, ss = np.meshgrid(grid, grid, indexing="xy")
    rr, ss = rr.ravel(), ss.ravel()
    for iy in range(len(LATS) - 1):
        for ix in range(len(LONGS) - 1):
            lon = LONGS[ix] + 4.0 * rr
            lat = LATS[iy] + 4.0 * ss
            box = in_panama_box(lon, lat)
            if not box.any() or deepest[iy, ix] < 0:
                continue
            above = panama_line(lon) <= lat
            sides = []
            for pick in (box & above, box & ~above, ~box):
                corners = np.full((len(P_LEVELS), 4), np.nan)
                if pick.sum() >= 8:
                    r, sv = rr[pick], ss[pick]
                    A = np.c_[np.ones_like(r), r, sv, r * sv]
                    for k in range(deepest[iy, ix] + 1):
                        f = np.asarray(gsw.SAAR(P_LEVELS[k] + 0 * r, lon[pick], lat[pick]), dtype=float)
                        c, *_ = np.linalg.lstsq(A, f, rcond=None)
                        # corners in the order SW, SE, NE, NW
                        corners[k] = [c[0], c[0] + c[1], c[0] + c[1] + c[2] + c[3], c[0] + c[2]]
                sides.append(corners)
            out.append({"lon_cell": ix, "lat_cell": iy,
                        "above_base64": base64.b64encode(sides[0].astype("<f8").tobytes()).decode("ascii"),
                        "below_base64": base64.b64encode(sides[1].astype("<f8").tobytes()).decode("ascii"),
                        "outside_base64": base64.b64encode(sides[2].astype("<f8").tobytes()).decode("ascii")})
    return out


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
            "meaning": "per 4-degree cell, the index of the deepest level the library reads (-1: the library answers 0 in the whole cell); below it the ratio is held constant; a level where no corner has a value reads 0",
            "layout": "index = lat_cell * (longitudes.count - 1) + lon_cell",
            "values": deepest.ravel().tolist(),
        },
        "panama": {
            "meaning": "cells the Panama box touches: corner values (SW, SE, NE, NW) per level for points in the box above (north-east of) the line, below it, and outside the box; NaN below the cell's deepest level or where the cell has no such part",
            "layout": "float64 little-endian, index = level * 4 + corner",
            "line_lon": PANAMA_LON.tolist(),
            "line_lat": PANAMA_LAT.tolist(),
            "cells": panama_cells(deepest),
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
