// Casts have a life: a corrected file asks whether it replaces the live cast (history kept, flags
// carried where levels match), a chief scientist removes and restores casts, never two live casts
// with the same station and cast, a file with a few bad lines is partly read and then accepted or
// rejected, a technician removes an upload that produced nothing, and malformed netCDF files and
// acquisition exports fail by name with nothing written while the server keeps serving.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { makeTestApp, createUser, addMember, agentFor, waitFor, type TestApp } from './helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cast, CastColumn, Cruise } from '../../server/models/index';

let t: TestApp;
let cruiseId: string;
let tech: Awaited<ReturnType<typeof agentFor>>;
let chief: Awaited<ReturnType<typeof agentFor>>;
const dir = mkdtempSync(join(tmpdir(), 'sl-life-'));

beforeAll(async () => {
  t = await makeTestApp();
  await startWorkers(t.deps, { concurrency: 2 });
  const c = await createUser('life-chief@example.test');
  const cr = await Cruise.create({
    name: 'Life',
    ship: 'RV Tessellate',
    startDate: '2026-03-01',
    endDate: '2026-03-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: c.id,
  });
  cruiseId = cr.id;
  await addMember(c.id, cr.id, 'chief_scientist');
  const u = await createUser('life-tech@example.test');
  await addMember(u.id, cr.id, 'technician');
  tech = await agentFor(t.app, 'life-tech@example.test');
  chief = await agentFor(t.app, 'life-chief@example.test');
}, 120_000);
afterAll(async () => {
  await t?.close();
});

/** An invented cast file; `skip` leaves out levels (dbar), `bad` writes text into some lines. */
function castFile(name: string, station: string, o: { skip?: number[]; warm?: number; bad?: number[] } = {}): string {
  const lines = [
    `# station: ${station}`,
    '# cast: 1',
    '# latitude: -30.5',
    '# longitude: -20.25',
    '# time: 2026-03-04T05:00:00Z',
    'pressure [dbar],temperature [ITS-90 degC],salinity [PSS-78]',
  ];
  for (let p = 2; p <= 200; p += 2) {
    if (o.skip?.includes(p)) continue;
    const tt = 4 + 16 * Math.exp(-p / 300) + (o.warm ?? 0);
    lines.push(
      o.bad?.includes(p) ? `${p},warm,35.1` : `${p},${tt.toFixed(4)},${(34.6 + Math.exp(-p / 250)).toFixed(4)}`,
    );
  }
  const f = join(dir, name);
  writeFileSync(f, lines.join('\n') + '\n');
  return f;
}
async function upload(file: string, who = tech) {
  const r = await who.agent
    .post(`/api/cruises/${cruiseId}/uploads`)
    .set('x-csrf-token', who.csrf)
    .attach('files', file);
  expect(r.status).toBe(202);
  return r.body.uploads[0].id as string;
}
const settled = (id: string) =>
  waitFor(async () => {
    const r = await tech.agent.get(`/api/uploads/${id}`);
    return ['ready', 'failed', 'awaiting_decision'].includes(r.body.status) ? r.body : null;
  }, 60_000);
const liveCasts = async () =>
  (await tech.agent.get(`/api/cruises/${cruiseId}/casts`)).body as {
    id: string;
    station: string;
    cast: string;
    partlyRead: { dropped: unknown[]; decision: string | null } | null;
  }[];
const post = (who: typeof tech, path: string, body: object = {}) =>
  who.agent.post(path).set('x-csrf-token', who.csrf).send(body);

describe('replace', () => {
  let firstId: string;
  it('a corrected file for a live station and cast waits for the answer, writing nothing', async () => {
    const a = await settled(await upload(castFile('L1-a.csv', 'L1')));
    expect(a.status).toBe('ready');
    firstId = a.castIds[0];
    // the technician flags 10–20 dbar questionable
    expect(
      (await post(tech, `/api/casts/${firstId}/flags`, { variable: 'temperature', pFrom: 10, pTo: 20, flag: 3 }))
        .status,
    ).toBe(200);
    const before = await Cast.unscoped().count();
    const b = await settled(await upload(castFile('L1-b.csv', 'L1', { warm: 0.01, skip: [12, 14] })));
    expect(b.status).toBe('awaiting_decision');
    expect(b.conflicts.items).toEqual([
      expect.objectContaining({ station: 'L1', cast: '1', existingCastId: firstId, existingFile: 'L1-a.csv' }),
    ]);
    expect(await Cast.unscoped().count()).toBe(before);
    // replace: the new version is live, the earlier one history; flags carried where levels match
    const r = await post(tech, `/api/uploads/${b.id}/replace-decision`, { replace: true });
    expect(r.status).toBe(202);
    const done = await settled(b.id);
    expect(done.status, JSON.stringify(done.errors)).toBe('ready');
    const live = (await liveCasts()).filter((c) => c.station === 'L1');
    expect(live).toHaveLength(1);
    expect(live[0].id).not.toBe(firstId);
    const cast = (await tech.agent.get(`/api/casts/${live[0].id}`)).body;
    const p = cast.columns.pressure as number[];
    const f = cast.flags.temperature as number[];
    for (let i = 0; i < p.length; i++) expect(f[i], `flag at ${p[i]} dbar`).toBe(p[i] >= 10 && p[i] <= 20 ? 3 : 2);
    expect(p).not.toContain(12);
    expect(cast.notes.join(' ')).toMatch(/could not be \(no level at 12, 14 dbar/);
    const h = (await tech.agent.get(`/api/casts/${live[0].id}/history`)).body;
    expect(h.versions.map((v: { uploadFile: string; live: boolean }) => [v.uploadFile, v.live])).toEqual([
      ['L1-a.csv', false],
      ['L1-b.csv', true],
    ]);
    expect(h.versions[0].uploadedBy.name).toBe('life-tech');
    expect(h.versions[0].supersededBy).toBe(live[0].id);
    expect((await tech.agent.get(`/api/casts/${firstId}`)).status).toBe(404);
  });

  it('"keep the earlier" leaves the corrected cast out', async () => {
    const c = await settled(await upload(castFile('L1-c.csv', 'L1', { warm: 0.02 })));
    expect(c.status).toBe('awaiting_decision');
    await post(tech, `/api/uploads/${c.id}/replace-decision`, { replace: false });
    const done = await settled(c.id);
    expect(done.status).toBe('ready');
    expect(done.castIds).toEqual([]);
    expect(done.warnings.map((w: { code: string }) => w.code)).toContain('kept_earlier');
    expect((await liveCasts()).filter((x) => x.station === 'L1')).toHaveLength(1);
  });
});

describe('remove and restore', () => {
  it('a chief scientist removes a cast (gone from lists and sections, audited) and restores it', async () => {
    const u = await settled(await upload(castFile('R1.csv', 'R1')));
    await settled(await upload(castFile('R2.csv', 'R2')));
    const id = u.castIds[0];
    expect((await post(tech, `/api/casts/${id}/remove`)).status).toBe(403);
    const r = await post(chief, `/api/casts/${id}/remove`, { reason: 'wrong station' });
    expect(r.status).toBe(200);
    expect((await liveCasts()).map((c) => c.id)).not.toContain(id);
    const sec = (
      await tech.agent.get(`/api/cruises/${cruiseId}/section`).query({ property: 'CT', coord: 'pressure', bin: 20 })
    ).body;
    expect(sec.stations.map((s: { id: string }) => s.id)).not.toContain(id);
    expect(
      (await tech.agent.get(`/api/cruises/${cruiseId}/removed-casts`)).body.map((c: { id: string }) => c.id),
    ).toContain(id);
    expect((await post(chief, `/api/casts/${id}/restore`)).status).toBe(200);
    expect((await liveCasts()).map((c) => c.id)).toContain(id);
    const trail = (await chief.agent.get(`/api/cruises/${cruiseId}/audit`)).body as {
      action: string;
      entityId: string;
    }[];
    expect(trail.filter((a) => a.entityId === id).map((a) => a.action)).toEqual(
      expect.arrayContaining(['remove_cast', 'restore_cast']),
    );
  });

  it('never two live casts with one station and cast: the database refuses, restore refuses, an upload with both fails', async () => {
    const live = (await liveCasts()).find((c) => c.station === 'R2')!;
    const row = (await Cast.findByPk(live.id))!.get({ plain: true }) as Record<string, unknown>;
    delete row.id;
    await expect(Cast.create({ ...row, sourceFile: 'copy.csv' } as never)).rejects.toMatchObject({
      name: 'SequelizeUniqueConstraintError',
    });
    // remove R2, upload a new R2 (no conflict now), then restoring the old one would make two
    await post(chief, `/api/casts/${live.id}/remove`);
    const n = await settled(await upload(castFile('R2-new.csv', 'R2', { warm: 0.05 })));
    expect(n.status).toBe('ready');
    const res = await post(chief, `/api/casts/${live.id}/restore`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('duplicate_cast');
    // two files of one upload with one station and cast
    const yazl = (await import('yazl')).default;
    const z = new yazl.ZipFile();
    z.addBuffer(readFileSync(castFile('D-a.csv', 'D9')), 'D-a.csv');
    z.addBuffer(readFileSync(castFile('D-b.csv', 'D9', { warm: 0.1 })), 'D-b.csv');
    z.end();
    const chunks: Buffer[] = [];
    await new Promise<void>((ok) => {
      z.outputStream.on('data', (b: Buffer) => chunks.push(b));
      z.outputStream.on('end', () => ok());
    });
    writeFileSync(join(dir, 'dups.zip'), Buffer.concat(chunks));
    const before = await Cast.unscoped().count();
    const d = await settled(await upload(join(dir, 'dups.zip')));
    expect(d.status).toBe('failed');
    expect(d.errors[0].code).toBe('duplicate_cast');
    expect(await Cast.unscoped().count()).toBe(before);
  });
});

describe('partly read', () => {
  it('a file with three bad lines ingests its good levels, lists the lines, and waits for accept or reject', async () => {
    const u = await settled(await upload(castFile('P1.csv', 'P1', { bad: [20, 40, 60] })));
    expect(u.status, JSON.stringify(u.errors)).toBe('ready');
    const c = (await liveCasts()).find((x) => x.station === 'P1')!;
    expect(c.partlyRead!.decision).toBeNull();
    const full = (await tech.agent.get(`/api/casts/${c.id}`)).body;
    expect(full.levels).toBe(97);
    // lines: 6 header lines, then 2 dbar per line from line 7
    expect(
      full.partlyRead.dropped.map((d: { line: number; column: number; code: string; file: string }) => [
        d.file,
        d.line,
        d.column,
        d.code,
      ]),
    ).toEqual([
      ['P1.csv', 16, 2, 'text_in_numeric'],
      ['P1.csv', 26, 2, 'text_in_numeric'],
      ['P1.csv', 36, 2, 'text_in_numeric'],
    ]);
    expect(full.notes.join(' ')).toMatch(/partly read: 3 lines/);
    expect((await post(tech, `/api/casts/${c.id}/partly-read`, { decision: 'accept' })).status).toBe(200);
    expect((await liveCasts()).find((x) => x.id === c.id)!.partlyRead!.decision).toBe('accepted');
    // a second one is rejected: it disappears (and is restorable)
    await settled(await upload(castFile('P2.csv', 'P2', { bad: [100] })));
    const c2 = (await liveCasts()).find((x) => x.station === 'P2')!;
    expect((await post(tech, `/api/casts/${c2.id}/partly-read`, { decision: 'reject' })).status).toBe(200);
    expect((await liveCasts()).map((x) => x.id)).not.toContain(c2.id);
  });

  it('too many bad lines: the file is refused whole, nothing written', async () => {
    const before = await CastColumn.count();
    const u = await settled(
      await upload(castFile('P3.csv', 'P3', { bad: Array.from({ length: 30 }, (_, i) => 2 + 2 * i) })),
    );
    expect(u.status).toBe('failed');
    expect(u.errors[0]).toMatchObject({ file: 'P3.csv', line: 7, column: 2, code: 'text_in_numeric' });
    expect(await CastColumn.count()).toBe(before);
  });
});

describe('uploads that produced nothing', () => {
  it('a technician removes a failed upload, not one with casts', async () => {
    const f = join(dir, 'empty.csv');
    writeFileSync(f, 'nothing here\n');
    const u = await settled(await upload(f));
    expect(u.status).toBe('failed');
    const r = await tech.agent.delete(`/api/uploads/${u.id}`).set('x-csrf-token', tech.csrf);
    expect(r.status).toBe(200);
    expect((await tech.agent.get(`/api/uploads/${u.id}`)).status).toBe(404);
    const withCasts = (await tech.agent.get(`/api/cruises/${cruiseId}/uploads`)).body.find(
      (x: { castIds: string[] }) => x.castIds.length > 0,
    );
    expect((await tech.agent.delete(`/api/uploads/${withCasts.id}`).set('x-csrf-token', tech.csrf)).status).toBe(409);
  });
});

describe('malformed netCDF and acquisition exports through the API', () => {
  const BAD = join(process.cwd(), 'fixtures/bad');
  const manifest = JSON.parse(readFileSync(join(BAD, 'manifest.json'), 'utf8')) as {
    files: { file: string; expect: string }[];
  };
  // One unreadable line is not a failure at intake: the file is partly read (salvage).
  const LINE_LEVEL = ['field_count', 'text_in_numeric', 'truncated'];
  const ours = manifest.files.filter((e) => /^(netcdf|acquisition)-/.test(e.file));
  const picked = ours.filter((e) => !LINE_LEVEL.includes(e.expect));
  it(`each of ${readdirSync(BAD).filter((f) => /^(netcdf|acquisition)-/.test(f)).length} files fails with its named error (or is partly read), nothing written, the server serving`, async () => {
    expect(picked.length).toBeGreaterThanOrEqual(15);
    const before = await Cast.unscoped().count();
    for (const e of picked) {
      const done = await settled(await upload(join(BAD, e.file)));
      expect(done.status, e.file).toBe('failed');
      expect(
        done.errors.map((x: { code: string }) => x.code),
        e.file,
      ).toContain(e.expect);
    }
    expect(await Cast.unscoped().count()).toBe(before);
    expect((await tech.agent.get(`/api/cruises/${cruiseId}/casts`)).status).toBe(200);
    const salvaged = ours.filter((e) => LINE_LEVEL.includes(e.expect));
    expect(salvaged.length).toBe(3);
    for (const e of salvaged) {
      const done = await settled(await upload(join(BAD, e.file)));
      if (done.status === 'awaiting_decision')
        await post(tech, `/api/uploads/${done.id}/replace-decision`, { replace: true });
      const end = await settled(done.id);
      expect(end.status, e.file).toBe('ready');
      const cast = (await tech.agent.get(`/api/casts/${end.castIds[0]}`)).body;
      expect(
        cast.partlyRead.dropped.map((d: { code: string }) => d.code),
        e.file,
      ).toEqual([e.expect]);
    }
  }, 120_000);
});
