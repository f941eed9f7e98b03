// Read a NetCDF file back with Debian's python3-netcdf4 (/usr/bin/python3 + netCDF4) and return
// its contents as JSON: masked values become null, char arrays strings, NaN the string "NaN".
import { spawnSync } from 'node:child_process';
import { GSW_PYTHON } from '../../reference/python';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export interface PyVariable {
  dtype: string;
  dimensions: string[];
  attributes: Record<string, unknown>;
  data: unknown;
}
export interface PyDataset {
  file_format: string;
  dimensions: Record<string, { size: number; unlimited: boolean }>;
  attributes: Record<string, unknown>;
  variables: Record<string, PyVariable>;
}

const SCRIPT = String.raw`
import json, sys, math
import numpy as np
import netCDF4

def clean(x):
    if isinstance(x, float):
        return "NaN" if math.isnan(x) else x
    if isinstance(x, list):
        return [clean(v) for v in x]
    return x

def attr(v):
    if isinstance(v, np.ndarray):
        return {"dtype": str(v.dtype), "value": clean(v.tolist())}
    if isinstance(v, np.generic):
        return {"dtype": str(v.dtype), "value": clean(v.item())}
    if isinstance(v, str):
        return {"dtype": "str", "value": v}
    return {"dtype": type(v).__name__, "value": clean(v)}

ds = netCDF4.Dataset(sys.argv[1])
out = {"file_format": ds.file_format,
       "dimensions": {k: {"size": len(d), "unlimited": d.isunlimited()} for k, d in ds.dimensions.items()},
       "attributes": {k: attr(ds.getncattr(k)) for k in ds.ncattrs()},
       "variables": {}}
for name, v in ds.variables.items():
    if v.dtype == np.dtype("S1"):
        v.set_auto_chartostring(False)
        raw = v[:]
        arr = np.ma.filled(raw, b"")
        # decode each string's bytes ourselves: chartostring in netCDF4 1.6 slices UTF-8 text by
        # characters, not bytes, and so runs multi-byte strings into their neighbours
        if arr.ndim == 0:
            data = arr.tobytes().rstrip(b"\0").decode("utf-8")
        else:
            flat = arr.reshape(-1, arr.shape[-1])
            strings = [row.tobytes().rstrip(b"\0").decode("utf-8") for row in flat]
            data = np.array(strings, dtype=object).reshape(arr.shape[:-1]).tolist()
    else:
        m = v[:]
        if np.ma.isMaskedArray(m):
            obj = np.ma.getdata(m).astype(object)
            obj[np.ma.getmaskarray(m)] = None
            data = clean(obj.tolist())
        else:
            data = clean(np.asarray(m).tolist())
    out["variables"][name] = {"dtype": str(v.dtype), "dimensions": list(v.dimensions),
                              "attributes": {k: attr(v.getncattr(k)) for k in v.ncattrs()}, "data": data}
print(json.dumps(out))
`;

/** Write `bytes` to a temporary file and read it back with /usr/bin/python3 + netCDF4. */
export function readWithPythonNetcdf4(bytes: Buffer): PyDataset {
  const dir = mkdtempSync(join(tmpdir(), 'sigmaline-nc-'));
  const file = join(dir, 'x.nc');
  writeFileSync(file, bytes);
  const r = spawnSync(GSW_PYTHON, ['-c', SCRIPT, file], { encoding: 'utf8', maxBuffer: 256 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(`python3 netCDF4 failed: ${r.stderr}`);
  return JSON.parse(r.stdout) as PyDataset;
}
