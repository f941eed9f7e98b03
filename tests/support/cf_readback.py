# Reads a delivered NetCDF with Debian's python3-netcdf4 and prints what a CF reader sees as JSON:
# global and variable attributes, the decoded time of each profile, and for every variable with an
# ancillary flag variable whether the missing values are masked where the flag says "no value" (9).
import json
import sys

import netCDF4
import numpy as np


def plain(v):
    if hasattr(v, 'tolist'):
        return v.tolist()
    return v


ds = netCDF4.Dataset(sys.argv[1])
out = {'globals': {k: plain(ds.getncattr(k)) for k in ds.ncattrs()}, 'variables': {}, 'checks': {}}
if 'profile_id' in ds.variables:
    out['profile_id'] = [str(x) for x in netCDF4.chartostring(ds.variables['profile_id'][:])]
t = ds.variables.get('time')
if t is not None:
    times = []
    for v in t[:]:
        if v is np.ma.masked:
            times.append(None)
        else:
            times.append(netCDF4.num2date(float(v), t.units, t.calendar, only_use_cftime_datetimes=False).strftime('%Y-%m-%dT%H:%M:%SZ'))
    out['time'] = times
for name, v in ds.variables.items():
    out['variables'][name] = {'dimensions': list(v.dimensions), 'dtype': str(v.dtype),
                              'attributes': {k: plain(v.getncattr(k)) for k in v.ncattrs()}}
for name, v in ds.variables.items():
    anc = getattr(v, 'ancillary_variables', None)
    if not anc:
        continue
    data = v[:]
    flag = ds.variables[anc][:]
    masked = np.ma.getmaskarray(data)
    f = np.ma.filled(flag, -1)
    out['checks'][name] = {
        'cells': int(data.size),
        'masked': int(masked.sum()),
        'flag9': int((f == 9).sum()),
        'flag_fill': int(np.ma.getmaskarray(flag).sum()),
        'value_where_flag9': int(((~masked) & (f == 9)).sum()),
        'masked_where_flag_not9': int((masked & (f != 9) & (f != -1)).sum()),
    }
print(json.dumps(out))
