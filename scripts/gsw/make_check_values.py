#!/usr/bin/python3
"""Turn the TEOS-10 GSW check values v3.0 into a JSON fixture for the seawater tests.

Source: TEOS-10 GSW check values v3.0, the file gsw/tests/gsw_cv_v3_0.npz shipped inside
Debian's package python3-gsw 3.6.16 (/usr/lib/python3/dist-packages/gsw/tests/gsw_cv_v3_0.npz).
Run with the system interpreter that has numpy:  /usr/bin/python3 scripts/gsw/make_check_values.py

The same package also ships geo_strf_dyn_height.npy and geo_strf_velocity.npy beside the npz:
check values the package regenerated (tests/write_geo_npyfiles.py) when the library moved dynamic
height to its pchip integration between bottles, replacing the npz's older Matlab-era values of
those two keys. They are written here as geo_strf_dyn_height_pchip and geo_strf_velocity_pchip
(same tolerances, geo_strf_dyn_height_ca and geo_strf_velocity_ca).

Every key of the npz is written (arrays as nested lists in the file's own layout: rows are
levels, columns are the three casts), NaN as null. The header fields name the source.
"""
import hashlib
import json
import math
import os
import sys

import numpy as np

TESTS = '/usr/lib/python3/dist-packages/gsw/tests'
SRC = TESTS + '/gsw_cv_v3_0.npz'
PCHIP_FILES = {
    'geo_strf_dyn_height_pchip': TESTS + '/geo_strf_dyn_height.npy',
    'geo_strf_velocity_pchip': TESTS + '/geo_strf_velocity.npy',
}
OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), '..', '..', 'fixtures', 'reference', 'gsw_cv_v3_0.json')


def clean(x):
    """numpy value -> JSON value, NaN/inf -> None."""
    if isinstance(x, np.ndarray):
        if x.dtype.kind in 'US':
            return x.tolist()
        return [clean(v) for v in x] if x.ndim > 0 else clean(x.item())
    if isinstance(x, (np.floating, float)):
        v = float(x)
        return v if math.isfinite(v) else None
    if isinstance(x, (np.integer, int)):
        return int(x)
    if isinstance(x, (np.str_, str)):
        return str(x)
    return x


def main():
    try:
        import gsw  # only for the version in the header
        gsw_version = gsw.__version__
    except Exception:  # pragma: no cover - header still names the package
        gsw_version = 'unknown'
    with open(SRC, 'rb') as fh:
        sha = hashlib.sha256(fh.read()).hexdigest()
    data = np.load(SRC)
    values = {k: clean(data[k]) for k in sorted(data.files)}
    for key, path in PCHIP_FILES.items():
        values[key] = clean(np.load(path))
    doc = {
        'source': 'TEOS-10 GSW check values v3.0 (gsw_cv_v3_0.npz)',
        'package': 'Debian python3-gsw 3.6.16',
        'package_reported_version': gsw_version,
        'path': SRC,
        'pchip_geostrophy_files': PCHIP_FILES,
        'sha256': sha,
        'generated_by': 'scripts/gsw/make_check_values.py',
        'layout': 'arrays are [level][cast] as in the npz (45 levels x 3 casts for cast keys); '
                  'NaN is null; keys ending in _ca are the absolute tolerances of the check',
        'values': values,
    }
    os.makedirs(os.path.dirname(OUT), exist_ok=True)
    with open(OUT, 'w') as fh:
        json.dump(doc, fh, separators=(',', ':'))
    print('wrote', os.path.normpath(OUT), len(values), 'keys', file=sys.stderr)


if __name__ == '__main__':
    main()
