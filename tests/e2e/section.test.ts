// The analyst's Section screen in headless Chromium on the demo cruise (40 invented casts, uploaded
// through the intake and processed by an in-process worker): the frame by pressure, the frame by
// density at σ2, the warnings of the inversions planted in the demo data (fixtures/demo/planted.json)
// counted, listed and drawn, a warned cast opened from the list, and a copied URL that reproduces
// the view. Every request that would leave loopback is blocked and counted; the test fails on any.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { startServer, launch, signIn, SHOTS } from './browser';
import { createUser, addMember, agentFor, waitFor, PASSWORD } from '../api/helpers';

type Planted = { kind: 'spike' | 'overturn'; station: string; pressure?: number; pTop?: number; pBottom?: number };
const planted = (
  JSON.parse(readFileSync(join(process.cwd(), 'fixtures/demo/planted.json'), 'utf8')) as { planted: Planted[] }
).planted;
const ANALYST = 'e2e-section-analyst@example.test';

let srv: Awaited<ReturnType<typeof startServer>>;
let chromium: Awaited<ReturnType<typeof launch>>;
let cruiseId: string;

beforeAll(async () => {
  srv = await startServer({ LOG_LEVEL: 'error' });
  const { startWorkers } = await import('../../server/jobs/worker');
  const { Cruise } = await import('../../server/models/index');
  await startWorkers(srv.t.deps, { concurrency: 2 });
  const tech = await createUser('e2e-section-tech@example.test', { name: 'Ilse Varga' });
  const analyst = await createUser(ANALYST, { name: 'Piet Orrin' });
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
  const files = readdirSync(dir).sort();
  expect(files).toHaveLength(46); // 40 main-line casts, the time-series site, the cross-line's four, one repeat
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
  const failed = (
    (await t.agent.get(`/api/cruises/${c.id}/uploads`)).body as { status: string; filename: string }[]
  ).filter((u) => u.status !== 'ready');
  expect(failed.map((u) => u.filename)).toEqual([]);
  chromium = await launch();
}, 100_000);
afterAll(async () => {
  await chromium?.browser.close();
  await srv?.close();
});

/** Waits until the frame whose figure label starts with `label` has been drawn by Plotly with the data asked for. */
async function drawnFrame(page: Page, label: string) {
  await page.locator(`figure[aria-label^="${label}"][data-plot-interactive]`).waitFor({ timeout: 30_000 });
}

/** The x positions of the inversion markers Plotly holds for a frame (what it drew). */
async function markerStations(page: Page, label: string): Promise<number> {
  return page.locator(`figure[aria-label^="${label}"] .js-plotly-plot`).evaluate((gd) => {
    const traces = (gd as unknown as { data: { name?: string; x: unknown[] }[] }).data;
    return traces.find((t) => t.name === 'inversions')?.x.length ?? 0;
  });
}

async function controls(page: Page) {
  const value = (name: string) => page.getByLabel(name, { exact: true }).inputValue();
  return {
    property: await value('Property'),
    ref: await value('Reference pressure'),
    layerSet: await value('Layer set'),
    inversions: await value('Inversion handling'),
    interpolation: await value('Interpolation'),
    densityShows: await value('Density frame shows'),
    cursor: await page.getByRole('application').getAttribute('aria-label'),
  };
}

/** The warnings of the inversion list: its count line and one row per warning. */
async function warnings(page: Page) {
  const list = page.getByRole('region', { name: /Inversions of/ });
  const spans = list.getByRole('heading').locator('span');
  const count = `${await spans.nth(0).textContent()}: ${await spans.nth(1).textContent()}`.replace(/\s+/g, ' ').trim();
  const rows = await list
    .getByRole('row')
    .filter({ has: page.getByRole('link') })
    .allTextContents();
  return { count, rows: rows.map((r) => r.replace(/\s+/g, ' ').trim()) };
}

describe('Section screen in Chromium', () => {
  it('analyst opens the demo section, goes to density coordinates at σ2, sees the planted inversions and opens a warned cast', async () => {
    const page = await chromium.newPage();
    await signIn(page, srv.url, ANALYST, PASSWORD);
    await page.waitForURL((u) => !u.pathname.startsWith('/signin'));
    const sectionUrl = `${srv.url}/cruises/${cruiseId}/section`;
    await page.goto(sectionUrl);

    // By pressure, σ0: both frames drawn, warnings counted and listed.
    await drawnFrame(page, 'Section by pressure');
    await drawnFrame(page, 'Section by density (σ₀)');
    await page.getByRole('region', { name: 'Inversions of σ0' }).waitFor();
    const atSigma0 = await warnings(page);
    expect(atSigma0.count).toBe(`Inversions of σ0: ${planted.length} in ${planted.length} casts`);
    expect(await markerStations(page, 'Section by pressure')).toBe(planted.length);
    await page.waitForLoadState('networkidle');
    await page.screenshot({ path: join(SHOTS, 'section-pressure.png'), fullPage: true });

    // Density coordinates: point at the density frame, and the readout reads σ, not pressure.
    const density = page.locator('figure[aria-label^="Section by density"] .nsewdrag').first();
    await density.scrollIntoViewIfNeeded();
    const box = (await density.boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.3, box.y + box.height * 0.5);
    const readout = page.getByRole('region', { name: 'Readout' });
    await readout.getByText('σ0', { exact: true }).waitFor();
    await expect.poll(async () => (await readout.textContent()) ?? '').toMatch(/kg\/m³/);

    // σ2: the reference pressure goes into the URL, the density frame is recomputed on σ2.
    await page.getByLabel('Reference pressure', { exact: true }).selectOption('2000');
    await page.waitForURL(/[?&]ref=2000/);
    await page.getByRole('heading', { name: 'By density (σ2)' }).waitFor();
    await drawnFrame(page, 'Section by density (σ₂)');
    await page.getByRole('region', { name: 'Inversions of σ2' }).waitFor();
    await expect
      .poll(async () => (await warnings(page)).count, { timeout: 20_000 })
      .toBe(`Inversions of σ2: ${planted.length} in ${planted.length} casts`);
    const atSigma2 = await warnings(page);
    // Every planted inversion is a warning of its class at its station, and there is no other.
    expect(atSigma2.rows).toHaveLength(planted.length);
    for (const p of planted) {
      const row = atSigma2.rows.find((r) => r.includes(p.station));
      expect(row, p.station).toBeDefined();
      expect(row, p.station).toContain(p.kind);
      if (p.kind === 'spike') expect(row, p.station).toContain(`–${p.pressure}`);
      else expect(row, p.station).toContain(`${p.pTop}–${p.pBottom}`);
    }
    await expect.poll(() => markerStations(page, 'Section by density (σ₂)')).toBe(planted.length);
    await page.getByRole('figure', { name: 'Section by density (σ₂)' }).scrollIntoViewIfNeeded();
    await page.waitForLoadState('networkidle');
    await page.screenshot({ path: join(SHOTS, 'section-density-sigma2.png'), fullPage: true });

    // A copied URL reproduces the view: the same controls and station cursor in a fresh page.
    await page.getByLabel('Interpolation', { exact: true }).selectOption('pchip');
    await page.waitForURL(/[?&]interp=pchip/);
    await page.getByRole('application').focus();
    await page.keyboard.press('ArrowRight');
    await page.waitForURL(/[?&]stn=/);
    // the controls follow the URL once the screen has re-rendered (the frames may still be drawing)
    await expect.poll(async () => (await controls(page)).interpolation, { timeout: 15_000 }).toBe('pchip');
    const shown = await controls(page);
    expect(shown).toMatchObject({ ref: '2000', interpolation: 'pchip' });
    expect(shown.cursor).toMatch(/Station cursor: CP-\d\d/);
    const copied = page.url();
    const other = await chromium.newPage();
    await signIn(other, srv.url, ANALYST, PASSWORD);
    await other.waitForURL((u) => !u.pathname.startsWith('/signin'));
    await other.goto(copied);
    await drawnFrame(other, 'Section by density (σ₂)');
    expect(await controls(other)).toEqual(shown);
    expect(new URL(other.url()).search).toBe(new URL(copied).search);
    await other.context().close();

    // Open the warned cast of the overturn from the list: its cast sheet loads.
    const overturn = planted.find((p) => p.kind === 'overturn')!;
    await page
      .getByRole('link', {
        name: `Open cast of station ${overturn.station}: inversion ${overturn.pTop} to ${overturn.pBottom} dbar`,
      })
      .click();
    await page.waitForURL(/\/casts\/[\w-]+/);
    await page.getByRole('heading', { name: new RegExp(`Station ${overturn.station}`) }).waitFor();
    await page
      .getByRole('region', { name: 'Density inversions' })
      .or(page.getByText('Density inversions'))
      .first()
      .waitFor();
    await page.locator('figure[data-plot-drawn]').first().waitFor({ timeout: 30_000 });
    await page.waitForLoadState('networkidle');
    await page.screenshot({ path: join(SHOTS, 'cast-from-warning.png'), fullPage: true });

    expect(chromium.offLoopback).toEqual([]);
  }, 100_000);
});
