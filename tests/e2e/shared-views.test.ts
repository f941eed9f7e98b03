// Issue #16's leftovers seen in headless Chromium on the demo cruise (40 invented casts through the
// intake): a view the analyst shared, seen by the technician with its owner named and no edit control;
// the T–S diagram coloured by station with its station key; the audit trail as sentences; the cast
// sheet's fitness table with its note. Screenshots go to screenshots/.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { startServer, launch, signIn, SHOTS } from './browser';
import { createUser, addMember, agentFor, waitFor, PASSWORD } from '../api/helpers';

let srv: Awaited<ReturnType<typeof startServer>>;
let chromium: Awaited<ReturnType<typeof launch>>;
let cruiseId = '';

beforeAll(async () => {
  srv = await startServer({ LOG_LEVEL: 'error' });
  const { startWorkers } = await import('../../server/jobs/worker');
  const { Cruise } = await import('../../server/models/index');
  await startWorkers(srv.t.deps, { concurrency: 2 });
  const tech = await createUser('e2e-sv-tech@example.test', { name: 'Tomas Leivesson' });
  const analyst = await createUser('e2e-sv-analyst@example.test', { name: 'Piet Orrin' });
  const c = await Cruise.create({
    name: 'Cinder Plateau line',
    ship: 'RV Fathom Wren',
    startDate: '2026-03-01',
    endDate: '2026-03-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: tech.id,
  });
  cruiseId = c.id;
  await addMember(tech.id, c.id, 'technician');
  await addMember(analyst.id, c.id, 'analyst');
  const t = await agentFor(srv.t.app, tech.email);
  const dir = join(process.cwd(), 'fixtures/demo/casts');
  const files = readdirSync(dir).sort().slice(0, 12);
  let req = t.agent.post(`/api/cruises/${c.id}/uploads`).set('x-csrf-token', t.csrf);
  for (const f of files) req = req.attach('files', join(dir, f));
  expect((await req).status).toBe(202);
  await waitFor(
    async () => {
      const list = (await t.agent.get(`/api/cruises/${c.id}/uploads`)).body as { status: string }[];
      return list.length === files.length && list.every((u) => u.status === 'ready' || u.status === 'failed');
    },
    75_000,
    500,
  );
  const a = await agentFor(srv.t.app, analyst.email);
  const saved = await a.agent
    .post(`/api/cruises/${c.id}/views`)
    .set('x-csrf-token', a.csrf)
    .send({ name: 'Salinity on σ2, by station', query: 'property=SA&ref=2000&ts=station', shared: true });
  expect(saved.status).toBe(201);
  chromium = await launch();
}, 120_000);
afterAll(async () => {
  await chromium?.browser.close();
  await srv?.close();
});

describe('shared views, T–S key, audit sentences, fitness note', () => {
  it('the technician sees the analyst’s shared view, read-only, and the T–S station key', async () => {
    const page = await chromium.newPage();
    await page.setViewportSize({ width: 1400, height: 1000 });
    await signIn(page, srv.url, 'e2e-sv-tech@example.test', PASSWORD);
    await page.goto(`${srv.url}/cruises/${cruiseId}/section?property=SA&ts=station`);
    const team = page.getByRole('list', { name: 'Views shared by the team' });
    await team.waitFor({ timeout: 30_000 });
    expect(await team.textContent()).toContain('by Piet Orrin, read-only');
    expect(await page.getByRole('button', { name: /Delete the view Salinity/ }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /Copy the view Salinity/ }).count()).toBe(1);
    await page.locator('figure[aria-label^="T–S diagram"][data-plot-interactive]').waitFor({ timeout: 40_000 });
    const ticks = await page.locator('figure[aria-label^="T–S diagram"] .colorbar .cbaxis text').allTextContents();
    expect(ticks.length).toBeGreaterThan(3);
    await page.getByRole('link', { name: 'Open the view Salinity on σ2, by station' }).click();
    await page.waitForURL(/ref=2000/);
    await page.waitForTimeout(2500);
    await page.screenshot({ path: join(SHOTS, 'f-section-shared-view.png'), fullPage: true });
    await page.locator('figure[aria-label^="T–S diagram"]').screenshot({ path: join(SHOTS, 'f-ts-station-key.png') });
    await page.goto(`${srv.url}/cruises/${cruiseId}`);
    const trail = page.getByRole('table', { name: 'Audit trail' });
    await trail.waitFor({ timeout: 20_000 });
    const text = await trail.textContent();
    expect(text).toMatch(/Tomas Leivesson processed CP?[\w-]*\.\w+: 1 cast\./);
    expect(text).not.toContain('{');
    await trail.screenshot({ path: join(SHOTS, 'f-audit-trail.png') });
    await page.goto(`${srv.url}/cruises/${cruiseId}/casts`);
    await page
      .locator('table[aria-label="Casts"] tbody tr a, [data-cast-row] a')
      .first()
      .click()
      .catch(() => undefined);
    const fit = page.locator('[data-fitness-note]');
    await fit.waitFor({ timeout: 20_000 });
    await page
      .locator('table[aria-label="Fitness of vertical coordinates"]')
      .locator('..')
      .screenshot({
        path: join(SHOTS, 'f-fitness.png'),
      });
  }, 180_000);
});
