// Builds a delivery into object storage: the regridded tables in each chosen format, or a zip data
// package with the raw files, tables, a provenance README and a checksum manifest.
import { createHash } from 'node:crypto';
import { Readable } from 'node:stream';
import { Delivery, Upload, User, type DeliveryFile } from '../models/index';
import { isopycnalTable, pressureTable } from './cruiseData';
import { writeCsv, writeXlsx, tableToNetcdf, buildDataPackage, formatProvenanceText, DATA_CAUTION, type DeliveryTable } from './deliveries/index';
import type { AppDeps } from '../lib/deps';

export type DeliveryParams = { kind: 'isopycnal' | 'pressure' | 'package'; ref: number; levels?: string; inversions: 'sort' | 'drop' | 'raw'; interpolation: 'linear' | 'pchip'; bin: number; flags: number[]; formats: ('csv' | 'xlsx' | 'nc')[]; line?: string };

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
async function toBuffer(stream: Readable): Promise<Buffer> {
  const parts: Buffer[] = [];
  for await (const c of stream) parts.push(Buffer.from(c as Buffer));
  return Buffer.concat(parts);
}

export async function deliveryTables(cruiseId: string, who: string, p: DeliveryParams): Promise<{ name: string; table: DeliveryTable }[]> {
  const iso = () => isopycnalTable(cruiseId, who, { ref: p.ref, levels: p.levels ?? null, handling: p.inversions, interpolation: p.interpolation, flags: p.flags, extras: [], line: p.line });
  const pres = () => pressureTable(cruiseId, who, { bin: p.bin, flags: p.flags, extras: [], line: p.line });
  if (p.kind === 'isopycnal') return [{ name: `isopycnal-sigma${p.ref / 1000}`, table: await iso() }];
  if (p.kind === 'pressure') return [{ name: `pressure-${p.bin}dbar`, table: await pres() }];
  return [{ name: `isopycnal-sigma${p.ref / 1000}`, table: await iso() }, { name: `pressure-${p.bin}dbar`, table: await pres() }];
}

export async function buildDelivery(deps: AppDeps, deliveryId: string) {
  const d = await Delivery.findByPk(deliveryId);
  if (!d || d.status === 'ready') return;
  await d.update({ status: 'building', progress: 0.05, error: null });
  const p = d.params as unknown as DeliveryParams;
  const who = d.createdBy ? (await User.findByPk(d.createdBy))?.email ?? 'unknown' : 'unknown';
  try {
    const tables = await deliveryTables(d.cruiseId, who, p);
    await d.update({ progress: 0.4 });
    const files: DeliveryFile[] = [];
    const put = async (filename: string, format: string, body: Buffer, type: string) => {
      const key = `cruises/${d.cruiseId}/deliveries/${d.id}/${filename}`;
      await deps.storage.put(key, body, type);
      files.push({ format, filename, key, size: body.length, sha256: sha(body) });
    };
    if (p.kind === 'package') {
      const uploads = await Upload.findAll({ where: { cruiseId: d.cruiseId, status: 'ready' }, order: [['createdAt', 'ASC']] });
      const readme = [`Sigmaline data package — ${tables[0].table.provenance.cruise.name} (${tables[0].table.provenance.cruise.ship})`, '', DATA_CAUTION, '',
        formatProvenanceText(tables[0].table.provenance), '', 'Contents: tables/ (regridded tables in each format), raw/ (the files as uploaded), MANIFEST.sha256 (sha256sum -c MANIFEST.sha256).'].join('\n');
      const zip = await toBuffer(buildDataPackage({ tables, formats: p.formats, readme,
        rawFiles: uploads.map((u) => ({ key: u.storageKey, filename: u.filename, read: () => deps.storage.get(u.storageKey) })) }));
      await put(`sigmaline-package-${d.id.slice(0, 8)}.zip`, 'zip', zip, 'application/zip');
    } else {
      for (const { name, table } of tables) {
        if (p.formats.includes('csv')) await put(`${name}.csv`, 'csv', Buffer.from(writeCsv(table)), 'text/csv');
        if (p.formats.includes('xlsx')) await put(`${name}.xlsx`, 'xlsx', await writeXlsx(table), 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
        if (p.formats.includes('nc')) await put(`${name}.nc`, 'nc', tableToNetcdf(table, { title: `${name} — ${table.provenance.cruise.name}` }), 'application/x-netcdf');
      }
    }
    await d.update({ status: 'ready', progress: 1, files });
  } catch (err) {
    await d.update({ status: 'failed', progress: 1, error: (err as Error).message.slice(0, 500) });
  }
}
