// Invented acquisition text exports for parser tests: a `*`/`#` header with column declarations,
// NMEA position and time lines, a bad-flag value, `*END*`, whitespace columns. Values from the same
// smooth made-up profile as the other samples (t = 4 + 16 exp(-p/300) °C, SP = 34.6 + exp(-p/250),
// O2 = 220 - 50 exp(-((p-600)/200)^2) µmol/kg); a second sensor pair reads 0.001 higher.
const tAt = (p: number): number => 4 + 16 * Math.exp(-p / 300);
const sAt = (p: number): number => 34.6 + Math.exp(-p / 250);
const oAt = (p: number): number => 220 - 50 * Math.exp(-(((p - 600) / 200) ** 2));
export const BAD_FLAG = '-9.990e-29';
const col = (x: string): string => x.padStart(11);

/** Two sensor pairs, pressure in db, oxygen in ml/l, extras, a flag column; bad-flag values at levels 10 and 40. */
function twoPairs(): string {
  const head = [
    '* Invented acquisition export for parser tests (Sigmaline)',
    '* Temperature SN = 0001',
    '* Conductivity SN = 0002',
    '* Temperature, 2 SN = 0003',
    '* System UTC = Mar 04 2026 05:10:12',
    '* NMEA Latitude = 34 07.50 S',
    '* NMEA Longitude = 021 30.00 W',
    '* NMEA UTC (Time) = Mar 04 2026 05:06:00',
    '** Ship: RV Tessellate',
    '** Station: K-11',
    '** Cast: 2',
    '** Water depth: 1480',
    '# nquan = 11',
    '# nvalues = 150',
    '# units = specified',
    '# name 0 = prs: Pressure [db]',
    '# name 1 = tmpA: Temperature [ITS-90, deg C]',
    '# name 2 = tmpB: Temperature, 2 [ITS-90, deg C]',
    '# name 3 = cndA: Conductivity [S/m]',
    '# name 4 = cndB: Conductivity, 2 [S/m]',
    '# name 5 = oxA: Oxygen [ml/l]',
    '# name 6 = salA: Salinity, Practical [PSU]',
    '# name 7 = salB: Salinity, Practical, 2 [PSU]',
    '# name 8 = flu: Fluorescence [mg/m^3]',
    '# name 9 = trn: Beam Transmission [%]',
    '# name 10 = flag:  0.000e+00',
    '# span 0 =      2.000,    300.000',
    '# interval = decibars: 2',
    '# start_time = Mar 04 2026 05:04:30 [header time]',
    `# bad_flag = ${BAD_FLAG}`,
    '# file_type = ascii',
    '*END*',
  ];
  const rows: string[] = [];
  for (let k = 0; k < 150; k++) {
    const p = 2 + 2 * k;
    const t = tAt(p);
    const c = 3.0 + 0.09 * t;
    const v = [
      p.toFixed(3),
      t.toFixed(4),
      (t + 0.001).toFixed(4),
      c.toFixed(6),
      (c + 0.001).toFixed(6),
      (oAt(p) / 44.661).toFixed(4),
      sAt(p).toFixed(4),
      (sAt(p) + 0.001).toFixed(4),
      (0.1 + 0.001 * k).toFixed(4),
      '98.5000',
      '0.000e+00',
    ];
    if (k === 10) v[1] = BAD_FLAG; // primary temperature lost at one level
    if (k === 40) v[5] = BAD_FLAG; // oxygen lost at another
    rows.push(v.map(col).join(''));
  }
  return [...head, ...rows].join('\n') + '\n';
}

/** One pair, depth (salt water, m) only, oxygen in µmol/kg, position from operator lines, start_time only. */
function depthOnly(): string {
  const head = [
    '* Invented acquisition export for parser tests (Sigmaline)',
    '** Station: D-2',
    '** Latitude: 10 30.00 N',
    '** Longitude: 045 15.00 W',
    '# nquan = 4',
    '# name 0 = dep: Depth [salt water, m]',
    '# name 1 = tmp: Temperature [ITS-90, deg C]',
    '# name 2 = sal: Salinity, Practical [PSU]',
    '# name 3 = oxy: Oxygen [umol/kg]',
    '# start_time = Mar 05 2026 11:20:00 [NMEA time, header]',
    `# bad_flag = ${BAD_FLAG}`,
    '*END*',
  ];
  const rows: string[] = [];
  for (let k = 0; k < 80; k++) {
    const d = 1 + 3 * k;
    rows.push([d.toFixed(3), tAt(d).toFixed(4), sAt(d).toFixed(4), oAt(d).toFixed(3)].map(col).join(''));
  }
  return [...head, ...rows].join('\n') + '\n';
}

export function acquisitionSamples(): Record<string, string> {
  return { 'acquisition-two-pairs.txt': twoPairs(), 'acquisition-depth.txt': depthOnly() };
}
