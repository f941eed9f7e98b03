// Saved section views shared with the cruise team: the owner saves, edits, shares and deletes; the
// other members read a shared view (list, open) and copy it into their own, but cannot change it; a
// view not shared stays its owner's; a non-member sees nothing.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { makeTestApp, createUser, addMember, agentFor, type TestApp } from './helpers';
import { Cruise } from '../../server/models/index';
import { savedViewListResponseSchema, savedViewResponseSchema } from '../../shared/api/resources';

let t: TestApp;
let cruiseId = '';
type Agent = Awaited<ReturnType<typeof agentFor>>;
const as: Record<'analyst' | 'tech' | 'pi' | 'outsider', Agent> = {} as never;

beforeAll(async () => {
  t = await makeTestApp();
  const analyst = await createUser('sv-analyst@example.test', { name: 'Ana Lyst' });
  const tech = await createUser('sv-tech@example.test', { name: 'Tomas Tech' });
  const pi = await createUser('sv-pi@example.test', { name: 'Pia Investigator' });
  await createUser('sv-out@example.test');
  const c = await Cruise.create({
    name: 'Views',
    ship: 'RV Views',
    startDate: '2026-01-01',
    endDate: '2026-01-10',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: analyst.id,
  });
  cruiseId = c.id;
  await addMember(analyst.id, cruiseId, 'analyst');
  await addMember(tech.id, cruiseId, 'technician');
  await addMember(pi.id, cruiseId, 'pi');
  as.analyst = await agentFor(t.app, analyst.email);
  as.tech = await agentFor(t.app, tech.email);
  as.pi = await agentFor(t.app, pi.email);
  as.outsider = await agentFor(t.app, 'sv-out@example.test');
}, 120_000);
afterAll(async () => {
  await t?.close();
});

const url = (rest = '') => `/api/cruises/${cruiseId}/views${rest}`;
const post = (a: Agent, body: unknown) =>
  a.agent
    .post(url())
    .set('x-csrf-token', a.csrf)
    .send(body as object);
const patch = (a: Agent, id: string, body: unknown) =>
  a.agent
    .patch(url(`/${id}`))
    .set('x-csrf-token', a.csrf)
    .send(body as object);
const del = (a: Agent, id: string) => a.agent.delete(url(`/${id}`)).set('x-csrf-token', a.csrf);

describe('saved views shared with the cruise team', () => {
  it('the owner saves a shared and a private view; teammates see only the shared one, with its owner', async () => {
    const shared = await post(as.analyst, { name: 'Salinity by σ2', query: '?property=SA&ref=2000', shared: true });
    expect(shared.status).toBe(201);
    const sv = savedViewResponseSchema.parse(shared.body);
    expect(sv).toMatchObject({ query: 'property=SA&ref=2000', shared: true, mine: true, owner: { name: 'Ana Lyst' } });
    const priv = await post(as.analyst, { name: 'Scratch', query: 'property=CT' });
    expect(priv.status).toBe(201);
    expect(priv.body.shared).toBe(false);

    const mine = savedViewListResponseSchema.parse((await as.analyst.agent.get(url())).body);
    expect(mine.map((v) => v.name).sort()).toEqual(['Salinity by σ2', 'Scratch']);
    for (const who of [as.tech, as.pi]) {
      const res = await who.agent.get(url());
      expect(res.status).toBe(200);
      const list = savedViewListResponseSchema.parse(res.body);
      expect(list.map((v) => [v.name, v.mine, v.owner.name])).toEqual([['Salinity by σ2', false, 'Ana Lyst']]);
      // opened one at a time too; the private one is no such view to them
      const one = await who.agent.get(url(`/${sv.id}`));
      expect(one.status).toBe(200);
      expect(one.body.query).toBe('property=SA&ref=2000');
      expect((await who.agent.get(url(`/${priv.body.id}`))).status).toBe(404);
    }
    // a non-member learns nothing
    expect((await as.outsider.agent.get(url())).status).toBe(404);
    expect((await as.outsider.agent.get(url(`/${sv.id}`))).status).toBe(404);
  });

  it('only the owner edits or deletes; a teammate is told who owns it and copies it instead', async () => {
    const { body: v } = await post(as.analyst, { name: 'Oxygen', query: 'property=oxygen', shared: true });
    const edit = await patch(as.tech, v.id, { name: 'Mine now' });
    expect(edit.status).toBe(403);
    expect(edit.body.error.code).toBe('not_owner');
    expect(edit.body.error.message).toContain('Ana Lyst');
    const gone = await del(as.pi, v.id);
    expect(gone.status).toBe(403);
    expect((await as.analyst.agent.get(url(`/${v.id}`))).body.name).toBe('Oxygen');

    // the copy is the teammate's own: private, theirs to edit
    const copy = await post(as.tech, { name: `${v.name} (copy)`, query: v.query });
    expect(copy.status).toBe(201);
    expect(copy.body).toMatchObject({ mine: true, shared: false, owner: { name: 'Tomas Tech' } });
    const renamed = await patch(as.tech, copy.body.id, { name: 'Oxygen, my copy' });
    expect(renamed.status).toBe(200);
    expect(renamed.body.name).toBe('Oxygen, my copy');
    // the analyst does not see the technician's private copy
    const names = (await as.analyst.agent.get(url())).body.map((x: { name: string }) => x.name);
    expect(names).not.toContain('Oxygen, my copy');

    // the owner edits: re-aims it and takes it back from the team
    const own = await patch(as.analyst, v.id, { query: '?property=oxygen&stn=x', shared: false });
    expect(own.status).toBe(200);
    expect(own.body).toMatchObject({ query: 'property=oxygen&stn=x', shared: false });
    expect((await as.tech.agent.get(url(`/${v.id}`))).status).toBe(404);
    expect((await patch(as.tech, v.id, { name: 'x' })).status).toBe(404);
    // and deletes it
    expect((await del(as.analyst, v.id)).status).toBe(204);
    expect((await as.analyst.agent.get(url(`/${v.id}`))).status).toBe(404);
    expect((await del(as.analyst, v.id)).status).toBe(404);
  });

  it('refuses bad bodies and ids with the error shape, writing nothing', async () => {
    const before = (await as.analyst.agent.get(url())).body.length;
    for (const body of [
      {},
      { name: '   ', query: '' },
      { name: 'x', query: 'q'.repeat(4001) },
      { name: 'x', query: '', shared: 'yes' },
      { name: 'x', query: '', owner: 'someone' },
    ]) {
      const res = await post(as.analyst, body);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBeTruthy();
    }
    const { body: v } = await post(as.analyst, { name: 'Keep', query: '' });
    expect((await patch(as.analyst, v.id, {})).status).toBe(400);
    expect((await patch(as.analyst, v.id, { userId: 'x' })).status).toBe(400);
    // path ids are checked as UUIDs by the route table (docs/security.md)
    expect((await patch(as.analyst, 'not-a-uuid', { name: 'y' })).status).toBe(400);
    expect((await as.analyst.agent.get(url())).body.length).toBe(before + 1);
  });
});
