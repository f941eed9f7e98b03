// Seeds the invented demo cruise and one account per role (development only; production seeds
// nothing). The demo casts go through the same intake as any upload: object storage, then the job.
import { readFileSync, readdirSync, existsSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { join } from 'node:path';
import { z } from 'zod';
import { loadSettings } from './config';
import { connectServices } from './services/index';
import { Cast, Cruise, LayerSet, Line, Membership, Station, Upload, User, type Role } from './models/index';
import { suggestedLayerSets } from '../shared/api/levels';
import { hashPassword } from './auth/passwords';
import { QUEUES } from './services/queue';
import { seedEarlierOccupation } from './seedEarlier';
import { ensureDefaultLine } from './services/lines';

export const DEMO_PASSWORD = 'sigmaline-demo';
export const DEMO_ACCOUNTS: { email: string; name: string; role: Role | 'admin' }[] = [
  { email: 'chief@sigmaline.test', name: 'Demo chief scientist', role: 'chief_scientist' },
  { email: 'tech@sigmaline.test', name: 'Demo technician', role: 'technician' },
  { email: 'analyst@sigmaline.test', name: 'Demo analyst', role: 'analyst' },
  { email: 'pi@sigmaline.test', name: 'Demo principal investigator', role: 'pi' },
  { email: 'admin@sigmaline.test', name: 'Site admin', role: 'admin' },
];

const DemoCruise = z
  .object({
    name: z.string(),
    ship: z.string(),
    startDate: z.string(),
    endDate: z.string(),
    description: z.string().nullish(),
    ports: z.object({ departure: z.string().nullish(), arrival: z.string().nullish() }).partial().nullish(),
    region: z.object({ name: z.string() }).passthrough().nullish(),
    team: z.array(z.object({ name: z.string(), role: z.string(), email: z.string() })).default([]),
    plannedStations: z.array(
      z
        .object({
          station: z.string(),
          latitude: z.number(),
          longitude: z.number(),
          plannedBottomDepth: z.number().nullish(),
        })
        .passthrough(),
    ),
    lines: z
      .array(
        z.object({
          name: z.string(),
          stations: z.array(z.string()),
          composite: z
            .object({ station: z.string(), shallowCast: z.string(), deepCast: z.string(), joinPressure: z.number() })
            .optional(),
        }),
      )
      .default([]),
  })
  .passthrough();

export async function seedDemo(opts: { root?: string; wait?: boolean } = {}) {
  const settings = loadSettings();
  if (settings.NODE_ENV === 'production') throw new Error('The demo seed does not run in production.');
  const root = opts.root ?? process.cwd();
  const deps = await connectServices(settings);
  const hash = await hashPassword(DEMO_PASSWORD);
  const demo = DemoCruise.parse(JSON.parse(readFileSync(join(root, 'fixtures/demo/cruise.json'), 'utf8')));
  const users: Record<string, User> = {};
  for (const a of DEMO_ACCOUNTS) {
    const person = demo.team.find((m) => m.email === a.email);
    const name = person ? person.name : a.name;
    const [u] = await User.findOrCreate({
      where: { email: a.email },
      defaults: { email: a.email, name, passwordHash: hash, isAdmin: a.role === 'admin' },
    });
    users[a.email] = u;
  }
  let cruise = await Cruise.findOne({ where: { name: demo.name } });
  if (!cruise) {
    cruise = await Cruise.create({
      name: demo.name,
      ship: demo.ship,
      startDate: demo.startDate,
      endDate: demo.endDate,
      portStart: demo.ports?.departure ?? null,
      portEnd: demo.ports?.arrival ?? null,
      region: demo.region?.name ?? null,
      description: demo.description ?? null,
      createdBy: users['chief@sigmaline.test'].id,
    });
    let order = 0;
    for (const s of demo.plannedStations)
      await Station.create({
        cruiseId: cruise.id,
        name: s.station,
        latitude: s.latitude,
        longitude: s.longitude,
        plannedDepth: s.plannedBottomDepth ?? null,
        order: ++order,
      });
  }
  // the default layer sets (σ0 for the upper ocean, σ2 below 1000 dbar) suit the demo section
  if ((await LayerSet.count({ where: { cruiseId: cruise.id } })) === 0) {
    for (const d of suggestedLayerSets())
      await LayerSet.create({
        cruiseId: cruise.id,
        name: d.name,
        referencePressure: d.ref,
        levels: d.spec,
        createdBy: users['analyst@sigmaline.test'].id,
      });
  }
  // the cross-line over the Corrow Rise (cruise.json `lines`; docs/lines.md): its own stations are
  // left out of the default line by the analyst (one click brings them back); its composite at the
  // crossing is chosen once the casts are in (below)
  const cross = demo.lines.find((l) => l.composite);
  if (cross && !(await Line.findOne({ where: { cruiseId: cruise.id, name: cross.name } }))) {
    await Line.create({
      cruiseId: cruise.id,
      name: cross.name,
      stations: cross.stations,
      polyline: null,
      corridorKm: null,
      createdBy: users['analyst@sigmaline.test'].id,
    });
    const main = new Set(demo.lines.filter((l) => !l.composite).flatMap((l) => l.stations));
    const def = await ensureDefaultLine(cruise.id);
    if (!def.exclude.length) await def.update({ exclude: cross.stations.filter((s) => !main.has(s)) });
  }
  for (const a of DEMO_ACCOUNTS) {
    if (a.role === 'admin') continue;
    await Membership.findOrCreate({
      where: { userId: users[a.email].id, cruiseId: cruise.id },
      defaults: { userId: users[a.email].id, cruiseId: cruise.id, role: a.role },
    });
  }
  const dir = join(root, 'fixtures/demo/casts');
  const files = existsSync(dir)
    ? readdirSync(dir)
        .filter((f) => !f.startsWith('.'))
        .sort()
    : [];
  const ids: string[] = [];
  for (const f of files) {
    const bytes = readFileSync(join(dir, f));
    const sha256 = createHash('sha256').update(bytes).digest('hex');
    const existing = await Upload.findOne({ where: { cruiseId: cruise.id, sha256 } });
    if (existing) {
      ids.push(existing.id);
      continue;
    }
    const key = `cruises/${cruise.id}/raw/${sha256}`;
    await deps.storage.put(key, bytes);
    const u = await Upload.create({
      cruiseId: cruise.id,
      filename: f,
      storageKey: key,
      sha256,
      size: bytes.length,
      createdBy: users['tech@sigmaline.test'].id,
    });
    await deps.queue.send(QUEUES.ingest, { uploadId: u.id });
    ids.push(u.id);
  }
  // the invented earlier occupation of the demo line (its own cruise; helper file seedEarlier.ts)
  ids.push(...(await seedEarlierOccupation({ root, deps, users })).uploadIds);
  if (opts.wait !== false && ids.length) {
    const end = Date.now() + 180_000;
    for (;;) {
      const pending = await Upload.count({ where: { id: ids, status: ['queued', 'processing'] } });
      if (!pending || Date.now() > end) break;
      await new Promise((r) => setTimeout(r, 300));
    }
    const failed = await Upload.findAll({ where: { id: ids, status: 'failed' } });
    for (const f of failed)
      console.warn(`[sigmaline] demo file ${f.filename} failed: ${JSON.stringify(f.errors).slice(0, 300)}`);
    if (cross?.composite) await chooseComposite(cruise.id, cross.name, cross.composite);
  }
  await deps.close();
  return { cruiseId: cruise.id, files: files.length };
}

/** The cross-line's composite at the crossing station, once both casts are in (left alone when chosen already). */
async function chooseComposite(
  cruiseId: string,
  lineName: string,
  c: { station: string; shallowCast: string; deepCast: string; joinPressure: number },
) {
  const line = await Line.findOne({ where: { cruiseId, name: lineName } });
  if (!line || line.casts[c.station]) return;
  const casts = await Cast.findAll({ where: { cruiseId, station: c.station }, attributes: ['id', 'cast'] });
  const shallow = casts.find((k) => k.cast === c.shallowCast);
  const deep = casts.find((k) => k.cast === c.deepCast);
  if (!shallow || !deep) return;
  await line.update({
    casts: { ...line.casts, [c.station]: { shallow: shallow.id, deep: deep.id, joinPressure: c.joinPressure } },
  });
}

const isMain = process.argv[1] && /server[\\/]seed\.ts$/.test(process.argv[1]);
if (isMain) {
  const r = await seedDemo({ wait: process.env.SEED_WAIT !== 'false' });
  console.log(`[sigmaline] demo cruise seeded (${r.files} cast files)`);
  process.exit(0);
}
