// Invented casts for the lines tests, written as the plain cast CSV (api.md): a smooth, stable
// profile (warm and salty at the top, cold below) from the surface to `deep` dbar.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { waitFor, type agentFor } from './helpers';

export type InventedCast = {
  station: string;
  cast: string;
  lat: number;
  lon: number;
  time: string;
  deep: number;
  bottom?: number | null;
  warm?: number;
};

export function castCsv(c: InventedCast): string {
  const out = [
    `# station: ${c.station}`,
    `# cast: ${c.cast}`,
    `# latitude: ${c.lat}`,
    `# longitude: ${c.lon}`,
    `# time: ${c.time}`,
  ];
  if (c.bottom) out.push(`# bottom_depth: ${c.bottom}`);
  out.push('pressure [dbar],temperature [ITS-90 degC],salinity [PSS-78]');
  const warm = c.warm ?? 0;
  for (let p = 2; p <= c.deep; p += 4) {
    const t = 2 + (16 + warm) * Math.exp(-p / 600);
    const s = 34.6 + 0.9 * Math.exp(-p / 500);
    out.push(`${p.toFixed(1)},${t.toFixed(4)},${s.toFixed(4)}`);
  }
  return out.join('\n') + '\n';
}

export function writeCasts(casts: InventedCast[]): string[] {
  const dir = mkdtempSync(join(tmpdir(), 'sl-lines-'));
  return casts.map((c) => {
    const f = join(dir, `${c.station}_c${c.cast}.csv`);
    writeFileSync(f, castCsv(c));
    return f;
  });
}

/** Upload files (one upload each) and wait until every upload of the cruise is ready. */
export async function uploadAndWait(who: Awaited<ReturnType<typeof agentFor>>, cruiseId: string, files: string[]) {
  let req = who.agent.post(`/api/cruises/${cruiseId}/uploads`).set('x-csrf-token', who.csrf);
  for (const f of files) req = req.attach('files', f);
  const res = await req;
  if (res.status !== 202) throw new Error(`upload failed: ${res.status} ${JSON.stringify(res.body)}`);
  await waitFor(
    async () => {
      const l = (await who.agent.get(`/api/cruises/${cruiseId}/uploads`)).body as {
        status: string;
        errors: unknown[];
      }[];
      const failed = l.find((u) => u.status === 'failed');
      if (failed) throw new Error(`an upload failed: ${JSON.stringify(failed.errors)}`);
      return l.length >= files.length && l.every((u) => u.status === 'ready');
    },
    120_000,
    300,
  );
}
