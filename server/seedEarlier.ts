// Seeds the invented EARLIER occupation of the demo line (fixtures/demo-earlier, written by
// scripts/make-demo-earlier.ts): its own cruise, TS-16-02 on the invented RV Tessellate, with the
// demo analyst and PI as members, its casts through the same intake as any upload. Called by the
// demo seed (server/seed.ts) after the demo cruise; development only, like it.
import { readFileSync, readdirSync, existsSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { join } from 'node:path';
import { z } from 'zod';
import { Cruise, LayerSet, Membership, Station, Upload, type User, type Role } from './models/index';
import { suggestedLayerSets } from '../shared/api/levels';
import { QUEUES } from './services/queue';
import type { AppDeps } from './lib/deps';

const EarlierCruise = z.object({
  name: z.string(),
  ship: z.string(),
  startDate: z.string(),
  endDate: z.string(),
  description: z.string().nullish(),
  ports: z.object({ departure: z.string().nullish(), arrival: z.string().nullish() }).partial().nullish(),
  region: z.object({ name: z.string() }).passthrough().nullish(),
  team: z.array(z.object({ name: z.string(), role: z.string(), email: z.string() })).default([]),
  plannedStations: z.array(
    z.object({
      station: z.string(),
      latitude: z.number(),
      longitude: z.number(),
      plannedBottomDepth: z.number().nullish(),
    }),
  ),
});

/** Upload ids queued (or found already), so the caller can wait for them with the demo's. */
export async function seedEarlierOccupation(opts: {
  root: string;
  deps: Pick<AppDeps, 'storage' | 'queue'>;
  users: Record<string, User>;
}): Promise<{ cruiseId: string | null; uploadIds: string[] }> {
  const file = join(opts.root, 'fixtures/demo-earlier/cruise.json');
  if (!existsSync(file)) return { cruiseId: null, uploadIds: [] };
  const demo = EarlierCruise.parse(JSON.parse(readFileSync(file, 'utf8')));
  const owner = opts.users['pi@sigmaline.test'] ?? Object.values(opts.users)[0];
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
      createdBy: owner.id,
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
  if ((await LayerSet.count({ where: { cruiseId: cruise.id } })) === 0) {
    for (const d of suggestedLayerSets())
      await LayerSet.create({
        cruiseId: cruise.id,
        name: d.name,
        referencePressure: d.ref,
        levels: d.spec,
        createdBy: owner.id,
      });
  }
  for (const m of demo.team) {
    const u = opts.users[m.email];
    if (!u) continue;
    await Membership.findOrCreate({
      where: { userId: u.id, cruiseId: cruise.id },
      defaults: { userId: u.id, cruiseId: cruise.id, role: m.role as Role },
    });
  }
  const dir = join(opts.root, 'fixtures/demo-earlier/casts');
  const files = existsSync(dir)
    ? readdirSync(dir)
        .filter((f) => !f.startsWith('.'))
        .sort()
    : [];
  const uploadIds: string[] = [];
  for (const f of files) {
    const bytes = readFileSync(join(dir, f));
    const sha256 = createHash('sha256').update(bytes).digest('hex');
    const existing = await Upload.findOne({ where: { cruiseId: cruise.id, sha256 } });
    if (existing) {
      uploadIds.push(existing.id);
      continue;
    }
    const key = `cruises/${cruise.id}/raw/${sha256}`;
    await opts.deps.storage.put(key, bytes);
    const u = await Upload.create({
      cruiseId: cruise.id,
      filename: f,
      storageKey: key,
      sha256,
      size: bytes.length,
      createdBy: owner.id,
    });
    await opts.deps.queue.send(QUEUES.ingest, { uploadId: u.id });
    uploadIds.push(u.id);
  }
  return { cruiseId: cruise.id, uploadIds };
}
