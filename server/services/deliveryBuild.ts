// Builds a delivery into object storage: the regridded tables in each chosen format, the line's casts
// as CTD exchange files (one zip), or a zip data package with the raw files, tables, exchange files,
// a provenance README and a checksum manifest. File names: `<cruise>_<line>_<kind>_<ref>.<ext>`.
import { createHash } from 'node:crypto';
import { performance } from 'node:perf_hooks';
import { Readable } from 'node:stream';
import { Delivery, Upload, User, type DeliveryFile } from '../models/index';
import { isopycnalTable, pressureTable, lineCastsForDelivery } from './deliveryTables';
import {
  writeCsv,
  writeXlsx,
  tableToNetcdf,
  buildDataPackage,
  formatProvenanceText,
  writeExchangeZip,
  deliveryStem,
  DATA_CAUTION,
  type DeliveryTable,
  type DeliveryFormat,
} from './deliveries/index';
import type { AppDeps } from '../lib/deps';
import { logger } from '../lib/logger';

export type DeliveryFileFormat = 'csv' | 'xlsx' | 'nc' | 'exchange';
export type DeliveryParams = {
  kind: 'isopycnal' | 'pressure' | 'package';
  line?: string | null;
  ref: number;
  levels?: string;
  inversions: 'sort' | 'drop' | 'raw';
  interpolation: 'linear' | 'pchip';
  bin: number;
  flags: number[];
  formats: DeliveryFileFormat[];
  extras?: string[];
};

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
async function toBuffer(stream: Readable): Promise<Buffer> {
  const parts: Buffer[] = [];
  for await (const c of stream) parts.push(Buffer.from(c as Buffer));
  return Buffer.concat(parts);
}

const cruiseOf = (t: DeliveryTable) => t.provenance.expocode ?? t.provenance.cruise.name;
const lineOf = (t: DeliveryTable) => t.provenance.line ?? 'default';

export async function deliveryTables(
  cruiseId: string,
  who: string,
  p: DeliveryParams,
): Promise<{ name: string; table: DeliveryTable }[]> {
  const extras = p.extras ?? [];
  const iso = async () => {
    const table = await isopycnalTable(cruiseId, who, {
      ref: p.ref,
      levels: p.levels ?? null,
      handling: p.inversions,
      interpolation: p.interpolation,
      flags: p.flags,
      extras,
      line: p.line ?? null,
    });
    return { name: deliveryStem(cruiseOf(table), lineOf(table), 'isopycnal', { sigmaRef: p.ref }), table };
  };
  const pres = async () => {
    const table = await pressureTable(cruiseId, who, { bin: p.bin, flags: p.flags, extras, line: p.line ?? null });
    return { name: deliveryStem(cruiseOf(table), lineOf(table), 'pressure', { bin: p.bin }), table };
  };
  if (p.kind === 'isopycnal') return [await iso()];
  if (p.kind === 'pressure') return [await pres()];
  return [await iso(), await pres()];
}

/** The line's casts as a zip of exchange files, with its stem. */
async function exchangeZip(cruiseId: string, p: DeliveryParams, table: DeliveryTable, folder?: string) {
  const casts = await lineCastsForDelivery(cruiseId, p.line ?? null);
  const expocode = cruiseOf(table);
  const zip = await writeExchangeZip(casts, { expocode, line: lineOf(table), provenance: table.provenance }, folder);
  return { stem: deliveryStem(expocode, lineOf(table), 'exchange', {}), zip, count: casts.length };
}

/** Time taken by each stage of a build, in ms (for the benchmark and the log). */
export type DeliveryStageTimes = Record<string, number>;

export async function buildDelivery(
  deps: AppDeps,
  deliveryId: string,
  opts: { onStages?: (stages: DeliveryStageTimes) => void } = {},
) {
  const d = await Delivery.findByPk(deliveryId);
  if (!d || d.status === 'ready') return;
  await d.update({ status: 'building', progress: 0.05, error: null });
  const p = d.params as unknown as DeliveryParams;
  const who = d.createdBy ? ((await User.findByPk(d.createdBy))?.email ?? 'unknown') : 'unknown';
  const stages: DeliveryStageTimes = {};
  let mark = performance.now();
  const stage = (name: string) => {
    const now = performance.now();
    stages[name] = (stages[name] ?? 0) + (now - mark);
    mark = now;
  };
  try {
    const tables = await deliveryTables(d.cruiseId, who, p);
    stage('tables');
    await d.update({ progress: 0.4 });
    const files: DeliveryFile[] = [];
    const put = async (filename: string, format: string, body: Buffer, type: string) => {
      stage(`write ${format}`);
      const key = `cruises/${d.cruiseId}/deliveries/${d.id}/${filename}`;
      await deps.storage.put(key, body, type);
      files.push({ format, filename, key, size: body.length, sha256: sha(body) });
      stage('storage put');
    };
    const first = tables[0].table;
    if (p.kind === 'package') {
      const uploads = await Upload.findAll({
        where: { cruiseId: d.cruiseId, status: 'ready' },
        order: [['createdAt', 'ASC']],
      });
      stage('uploads');
      const exchange = p.formats.includes('exchange') ? await exchangeZip(d.cruiseId, p, first) : null;
      stage('write exchange');
      const readme = [
        `Sigmaline data package — ${first.provenance.cruise.name} (${first.provenance.cruise.ship}), line ${lineOf(first)}`,
        '',
        DATA_CAUTION,
        '',
        formatProvenanceText(first.provenance),
        '',
        'Contents: tables/ (regridded tables in each format), exchange/ (one CTD exchange file per cast, when chosen), raw/ (the files as uploaded), ' +
          'MANIFEST.sha256 (sha256sum -c MANIFEST.sha256).',
      ].join('\n');
      // the time of each kind of entry of the package (an entry is timed until the next one starts)
      let entryKind = 'write zip';
      const zip = await toBuffer(
        buildDataPackage({
          onProgress: ({ entry }) => {
            stage(entryKind);
            entryKind = `zip ${entry.startsWith('raw/') ? 'raw files' : (entry.split('.').pop() ?? entry)}`;
          },
          tables,
          formats: p.formats.filter((f): f is DeliveryFormat => f !== 'exchange'),
          readme,
          extraFiles: exchange
            ? [
                {
                  path: `exchange/${exchange.stem}.zip`,
                  describe: `CTD exchange files of the line's ${exchange.count} casts (zip)`,
                  read: async () => exchange.zip,
                },
              ]
            : [],
          rawFiles: uploads.map((u) => ({
            key: u.storageKey,
            filename: u.filename,
            read: () => deps.storage.get(u.storageKey),
          })),
        }),
      );
      stage(entryKind);
      await put(
        `${deliveryStem(cruiseOf(first), lineOf(first), 'package', { sigmaRef: p.ref })}.zip`,
        'zip',
        zip,
        'application/zip',
      );
    } else {
      for (const { name, table } of tables) {
        if (p.formats.includes('csv')) await put(`${name}.csv`, 'csv', Buffer.from(writeCsv(table)), 'text/csv');
        if (p.formats.includes('xlsx'))
          await put(
            `${name}.xlsx`,
            'xlsx',
            await writeXlsx(table),
            'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
          );
        if (p.formats.includes('nc'))
          await put(
            `${name}.nc`,
            'nc',
            tableToNetcdf(table, { title: `${name} — ${table.provenance.cruise.name}` }),
            'application/x-netcdf',
          );
      }
      if (p.formats.includes('exchange')) {
        stage('write other');
        const x = await exchangeZip(d.cruiseId, p, first);
        await put(`${x.stem}.zip`, 'exchange', x.zip, 'application/zip');
      }
    }
    await d.update({ status: 'ready', progress: 1, files });
    stage('finish');
    opts.onStages?.(stages);
    logger.info(
      { deliveryId, stages: Object.fromEntries(Object.entries(stages).map(([k, v]) => [k, Math.round(v)])) },
      'delivery built',
    );
  } catch (err) {
    await d.update({ status: 'failed', progress: 1, error: (err as Error).message.slice(0, 500) });
  }
}
