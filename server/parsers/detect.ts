// Which reader a file goes to, from its first bytes and lines (the filename only breaks ties).
import { EXCHANGE_BOTTLE_FIRST_LINE, EXCHANGE_FIRST_LINE } from './exchange';
import { detectDelimiter } from './plain';
import { looksLikeStationTable } from './stationTable';
import { isZip } from './zip';
import { isHdf5, isNetcdf3 } from './ncfile';
import { looksLikeAcquisitionExport } from './acquisition';

export type DetectedFormat =
  'zip' | 'netcdf' | 'hdf5' | 'exchange' | 'exchangeBottle' | 'acquisition' | 'stationTable' | 'plain';

export function detectFormat(filename: string, bytes: Uint8Array): DetectedFormat {
  if (isZip(bytes) || /\.zip$/i.test(filename)) return 'zip';
  // Binary formats by their magic bytes: netCDF-3 ("CDF" + version) and HDF5 (netCDF-4).
  if (isNetcdf3(bytes)) return 'netcdf';
  if (isHdf5(bytes)) return 'hdf5';
  // A lenient look at the start only; the chosen reader does the strict decoding.
  const head = new TextDecoder('utf-8', { fatal: false }).decode(bytes.subarray(0, 65536)).replace(/^\uFEFF/, '');
  const lines = head.split(/\r\n|\n|\r/);
  const firstReal = lines.find((l) => l.trim() !== '') ?? '';
  if (EXCHANGE_FIRST_LINE.test(firstReal)) return 'exchange';
  if (EXCHANGE_BOTTLE_FIRST_LINE.test(firstReal)) return 'exchangeBottle';
  // The name breaks a tie: a data-office bottle file whose type line was lost.
  if (/_hy1\.csv$/i.test(filename) && lines.some((l) => /^\s*EXPOCODE\s*,/i.test(l))) return 'exchangeBottle';
  if (lines.some((l) => /^\s*NUMBER_HEADERS\s*=/i.test(l))) return 'exchange';
  if (looksLikeAcquisitionExport(lines)) return 'acquisition';
  const header = lines.find((l) => l.trim() !== '' && !l.trimStart().startsWith('#'));
  if (header !== undefined) {
    const d = detectDelimiter(header);
    const fields =
      d === 'whitespace' ? header.trim().split(/\s+/) : header.split(d).map((s) => s.trim().replace(/^"|"$/g, ''));
    if (looksLikeStationTable(fields)) return 'stationTable';
  }
  return 'plain';
}
