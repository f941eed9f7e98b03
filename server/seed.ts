// Seeds the invented demo cruise and one account per role (development only; production seeds
// nothing). The demo casts go through the same intake as any upload: object storage, then the job.
import { readFileSync, readdirSync, existsSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { join } from 'node:path';
import { z } from 'zod';
import { loadSettings } from './config';
import { connectServices } from './services/index';
import { Cruise, Membership, Station, Upload, User, type Role } from './models/index';
import { hashPassword } from './auth/passwords';
import { QUEUES } from './services/queue';

export const DEMO_PASSWORD = 'sigmaline-demo';
export const DEMO_ACCOUNTS: { email: string; name: string; role: Role | 'admin' }[] = [
  { email: 'chief@sigmaline.test', name: 'Ilse Marrow (chief scientist)', role: 'chief_scientist' },
  { email: 'tech@sigmaline.test', name: 'Tomas Quillon (technician)', role: 'technician' },
  { email: 'analyst@sigmaline.test', name: 'Priya Venn (analyst)', role: 'analyst' },
  { email: 'pi@sigmaline.test', name: 'Odile Fenwright (principal investigator)', role: 'pi' },
  { email: 'admin@sigmaline.test', name: 'Site admin', role: 'admin' },
];

const DemoCruise = z.object({
  cruise: z.object({ name: z.string(), ship: z.string(), startDate: z.string(), endDate: z.string(), portStart: z.string().nullish(), portEnd: z.string().nullish(), region: z.string().nullish(), description: z.string().nullish() }).passthrough(),
  stations: z.array(z.object({ name: z.string(), latitude: z.number(), longitude: z.number(), plannedDepth: z.number().nullish() }).passthrough()),
}).passthrough();

export async function seedDemo(opts: { root?: string; wait?: boolean } = {}) {
  const settings = loadSettings();
  if (settings.NODE_ENV === 'production') throw new Error('The demo seed does not run in production.');
  const root = opts.root ?? process.cwd();
  const deps = await connectServices(settings);
  const hash = await hashPassword(DEMO_PASSWORD);
  const users: Record<string, User> = {};
  for (const a of DEMO_ACCOUNTS) {
    const [u] = await User.findOrCreate({ where: { email: a.email }, defaults: { email: a.email, name: a.name, passwordHash: hash, isAdmin: a.role === 'admin' } });
    users[a.email] = u;
  }
  const demo = DemoCruise.parse(JSON.parse(readFileSync(join(root, 'fixtures/demo/cruise.json'), 'utf8')));
  let cruise = await Cruise.findOne({ where: { name: demo.cruise.name } });
  if (!cruise) {
    const c = demo.cruise;
    cruise = await Cruise.create({ name: c.name, ship: c.ship, startDate: c.startDate, endDate: c.endDate, portStart: c.portStart ?? null, portEnd: c.portEnd ?? null,
      region: c.region ?? null, description: c.description ?? null, createdBy: users['chief@sigmaline.test'].id });
    let order = 0;
    for (const s of demo.stations) await Station.create({ cruiseId: cruise.id, name: s.name, latitude: s.latitude, longitude: s.longitude, plannedDepth: s.plannedDepth ?? null, order: ++order });
  }
  for (const a of DEMO_ACCOUNTS) {
    if (a.role === 'admin') continue;
    await Membership.findOrCreate({ where: { userId: users[a.email].id, cruiseId: cruise.id }, defaults: { userId: users[a.email].id, cruiseId: cruise.id, role: a.role } });
  }
  const dir = join(root, 'fixtures/demo/casts');
  const files = existsSync(dir) ? readdirSync(dir).filter((f) => !f.startsWith('.')).sort() : [];
  const ids: string[] = [];
  for (const f of files) {
    const bytes = readFileSync(join(dir, f));
    const sha256 = createHash('sha256').update(bytes).digest('hex');
    const existing = await Upload.findOne({ where: { cruiseId: cruise.id, sha256 } });
    if (existing) { ids.push(existing.id); continue; }
    const key = `cruises/${cruise.id}/raw/${sha256}`;
    await deps.storage.put(key, bytes);
    const u = await Upload.create({ cruiseId: cruise.id, filename: f, storageKey: key, sha256, size: bytes.length, createdBy: users['tech@sigmaline.test'].id });
    await deps.queue.send(QUEUES.ingest, { uploadId: u.id });
    ids.push(u.id);
  }
  if (opts.wait !== false && ids.length) {
    const end = Date.now() + 180_000;
    for (;;) {
      const pending = await Upload.count({ where: { id: ids, status: ['queued', 'processing'] } });
      if (!pending || Date.now() > end) break;
      await new Promise((r) => setTimeout(r, 300));
    }
    const failed = await Upload.findAll({ where: { id: ids, status: 'failed' } });
    for (const f of failed) console.warn(`[sigmaline] demo file ${f.filename} failed: ${JSON.stringify(f.errors).slice(0, 300)}`);
  }
  await deps.close();
  return { cruiseId: cruise.id, files: files.length };
}

const isMain = process.argv[1] && /server[\\/]seed\.ts$/.test(process.argv[1]);
if (isMain) {
  const r = await seedDemo({ wait: process.env.SEED_WAIT !== 'false' });
  console.log(`[sigmaline] demo cruise seeded (${r.files} cast files)`);
  process.exit(0);
}
