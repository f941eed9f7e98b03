// The QC desk of the cast sheet in headless Chromium, on invented demo casts (fixtures/demo; CP-03 has a planted
// salinity spike at 1204 dbar, CP-11 an overturn at 68–98 dbar; a behaviour check, not a reference): neighbours
// overlaid in every panel (T–S included), a pending proposal accepted and rejected from the keyboard, the flag
// log with undo, a sideways drag that flags the pressure span it covers, and screenshots at 1280×800 and
// 1920×1080. Then the line picker (the neighbours follow the line chosen), the same station in the earlier
// occupation (fixtures/demo-earlier, TS-16-02, a line of the same name) overlaid for a member of both cruises and
// absent for a member of the later one only, and a rejected proposal reopened from the keyboard. Every request that
// would leave loopback is blocked and counted; the test fails on any.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { startServer, launch, signIn, SHOTS } from './browser';
import { createUser, addMember, agentFor, waitFor, PASSWORD } from '../api/helpers';

const TECH = 'e2e-qc-tech@example.test';
const LATER_ONLY = 'e2e-qc-later-only@example.test';
const earlierOf: Record<string, string> = {};
const lineOf: Record<string, string> = {};
let srv: Awaited<ReturnType<typeof startServer>>;
let chromium: Awaited<ReturnType<typeof launch>>;
let cruiseId: string;
let api: Awaited<ReturnType<typeof agentFor>>;
const castOf: Record<string, string> = {};

beforeAll(async () => {
  srv = await startServer({ LOG_LEVEL: 'error' });
  const { startWorkers } = await import('../../server/jobs/worker');
  const { Cruise } = await import('../../server/models/index');
  await startWorkers(srv.t.deps, { concurrency: 2 });
  const tech = await createUser(TECH, { name: 'Ilse Varga' });
  const c = await Cruise.create({
    name: 'Corrow Passage',
    ship: 'RV Tessellate',
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
  api = await agentFor(srv.t.app, TECH);
  const dir = join(process.cwd(), 'fixtures/demo');
  // the station plan first, so the neighbours follow it
  const plan = await api.agent
    .post(`/api/cruises/${c.id}/uploads`)
    .set('x-csrf-token', api.csrf)
    .attach('files', join(dir, 'stations.csv'));
  expect(plan.status).toBe(202);
  await waitFor(
    async () =>
      (await api.agent.get(`/api/uploads/${plan.body.uploads[0].id}`)).body.status === 'ready' ? true : null,
    60_000,
  );
  let req = api.agent.post(`/api/cruises/${c.id}/uploads`).set('x-csrf-token', api.csrf);
  for (const s of ['CP-02', 'CP-03', 'CP-04', 'CP-10', 'CP-11'])
    req = req.attach('files', join(dir, 'casts', `${s}.csv`));
  expect((await req).status).toBe(202);
  await waitFor(
    async () => {
      const list = (await api.agent.get(`/api/cruises/${c.id}/uploads`)).body as { status: string }[];
      return list.length === 6 && list.every((u) => u.status === 'ready') ? true : null;
    },
    90_000,
    500,
  );
  for (const cast of (await api.agent.get(`/api/cruises/${c.id}/casts`)).body as { id: string; station: string }[])
    castOf[cast.station] = cast.id;
  // the earlier occupation: its own cruise ten years before, three stations of it
  const e = await Cruise.create({
    name: 'TS-16-02',
    ship: 'RV Tessellate',
    startDate: '2016-03-01',
    endDate: '2016-03-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: tech.id,
  });
  await addMember(tech.id, e.id, 'technician');
  const later = await createUser(LATER_ONLY, { name: 'Jon Aske' });
  await addMember(later.id, c.id, 'technician');
  let reqE = api.agent.post(`/api/cruises/${e.id}/uploads`).set('x-csrf-token', api.csrf);
  for (const s of ['CP-02', 'CP-03', 'CP-04'])
    reqE = reqE.attach('files', join(process.cwd(), 'fixtures/demo-earlier/casts', `${s}.csv`));
  expect((await reqE).status).toBe(202);
  await waitFor(
    async () => {
      const list = (await api.agent.get(`/api/cruises/${e.id}/uploads`)).body as { status: string }[];
      return list.length === 3 && list.every((u) => u.status === 'ready') ? true : null;
    },
    90_000,
    500,
  );
  for (const cast of (await api.agent.get(`/api/cruises/${e.id}/casts`)).body as { id: string; station: string }[])
    earlierOf[cast.station] = cast.id;
  // a line of the same name in both cruises: occupations of one line (docs/occupations.md)
  const analyst = await createUser('e2e-qc-analyst@example.test');
  for (const id of [c.id, e.id]) await addMember(analyst.id, id, 'analyst');
  const drawer = await agentFor(srv.t.app, analyst.email);
  const mkLine = async (cruise: string, stations: string[]) => {
    const r = await drawer.agent
      .post(`/api/cruises/${cruise}/lines`)
      .set('x-csrf-token', drawer.csrf)
      .send({ name: 'Corrow west', stations });
    expect(r.status).toBe(201);
    return r.body.id as string;
  };
  lineOf.later = await mkLine(c.id, ['CP-02', 'CP-03', 'CP-10', 'CP-11']);
  lineOf.earlier = await mkLine(e.id, ['CP-02', 'CP-03', 'CP-04']);
  chromium = await launch();
}, 150_000);
afterAll(async () => {
  await chromium?.browser.close();
  await srv?.close();
});

const figure = (page: Page, label: string) => page.locator(`figure[aria-label^="${label}"]`);
async function drawn(page: Page) {
  for (const l of ['Measured profiles of', 'Profiles of', 'T–S diagram'])
    await figure(page, l).and(page.locator('[data-plot-drawn]')).waitFor({ timeout: 40_000 });
}
/** Names of the traces Plotly holds for a figure. */
const traceNames = (page: Page, label: string) =>
  figure(page, label)
    .locator('.js-plotly-plot')
    .evaluate((gd) => (gd as unknown as { data: { name?: string }[] }).data.map((t) => t.name ?? ''));
const flagsOf = async (castId: string) =>
  (await api.agent.get(`/api/casts/${castId}`)).body as {
    columns: { pressure: number[] };
    flags: Record<string, number[]>;
  };

describe('cast sheet QC desk', () => {
  it('shows neighbours and pending proposals; keys accept; the flag log undoes; a sideways drag flags its span', async () => {
    const page = await chromium.newPage();
    await signIn(page, srv.url, TECH, PASSWORD);
    await page.waitForURL((u) => !u.pathname.startsWith('/signin'));
    await page.goto(`${srv.url}/cruises/${cruiseId}/casts/${castOf['CP-03']}`);
    await page.getByRole('heading', { name: /Station CP-03/ }).waitFor();
    await drawn(page);
    await page.getByText('Neighbours along the line “All stations”: previous CP-02, next CP-04.').waitFor();
    await page.getByRole('heading', { name: 'Proposed flags · 1 pending' }).waitFor();

    // every panel carries both neighbours: measured (t, SP, O₂, fluorescence), derived (CT, SA, σ), T–S
    const measured = await traceNames(page, 'Measured profiles of');
    expect(measured.filter((n) => n.startsWith('previous · CP-02')).length).toBe(4);
    expect(measured.filter((n) => n.startsWith('next · CP-04')).length).toBe(4);
    const derived = await traceNames(page, 'Profiles of');
    expect(derived.filter((n) => n.startsWith('previous · CP-02')).length).toBe(4); // CT, SA, σ, N²
    expect(await traceNames(page, 'T–S diagram')).toEqual(
      expect.arrayContaining(['previous · CP-02', 'next · CP-04', 'station CP-03']),
    );
    expect(measured.some((n) => n.endsWith('proposals'))).toBe(true);

    await page.waitForLoadState('networkidle');
    await page.screenshot({ path: join(SHOTS, 'castsheet-qc-1280.png'), fullPage: true });
    await page.setViewportSize({ width: 1920, height: 1080 });
    await drawn(page);
    await page.waitForTimeout(500);
    await page.screenshot({ path: join(SHOTS, 'castsheet-qc-1920.png'), fullPage: false });
    await page.screenshot({ path: join(SHOTS, 'castsheet-qc-1920-full.png'), fullPage: true });

    // the neighbours differ from this cast by less than a pixel at full depth: zoom into the upper 1500 dbar to see them
    await page.getByRole('button', { name: 'Upper 1500 dbar' }).click();
    await page.waitForTimeout(800);
    await page.screenshot({ path: join(SHOTS, 'castsheet-neighbours-upper-1920.png'), fullPage: false });
    // and a zoom box (drag in zoom mode) on the temperature panel around 200 dbar, where CP-02 and CP-04 part from CP-03
    const tPlot = figure(page, 'Measured profiles of').locator('.js-plotly-plot');
    const box = await tPlot.evaluate((gd) => {
      type Ax = { _offset: number; c2p: (v: number) => number };
      const fl = (gd as unknown as { _fullLayout: { xaxis: Ax; yaxis: Ax } })._fullLayout;
      const r = gd.getBoundingClientRect();
      const x = (v: number) => r.left + fl.xaxis._offset + fl.xaxis.c2p(v);
      const y = (v: number) => r.top + fl.yaxis._offset + fl.yaxis.c2p(v);
      return { x0: x(15.5), x1: x(20.5), y0: y(160), y1: y(240) };
    });
    await page.mouse.move(box.x0, box.y0);
    await page.mouse.down();
    await page.mouse.move(box.x1, box.y1, { steps: 8 });
    await page.mouse.up();
    await page.waitForTimeout(800);
    await figure(page, 'Measured profiles of').screenshot({ path: join(SHOTS, 'castsheet-neighbours-zoom-1920.png') });
    await page.getByRole('button', { name: 'Full depth' }).click();

    // keyboard: j goes to the proposal and fills the form; a accepts it
    await page.locator('body').press('j');
    await expect.poll(() => page.getByLabel('From (dbar)').inputValue()).toBe('1204');
    expect(await page.getByLabel('Variable').inputValue()).toBe('salinity');
    expect(await page.getByLabel('Flag', { exact: true }).inputValue()).toBe('3');
    await page.getByTestId('flag-preview').getByText('Set flag will flag 1 level of salinity as 3.').waitFor();
    await page.locator('body').press('a');
    await page.getByRole('heading', { name: 'Proposed flags', exact: true }).waitFor();
    const log = page.getByRole('table', { name: 'Flag log' });
    await log.getByText('accepted proposal').waitFor();
    await page
      .getByRole('table', { name: 'Density inversions' })
      .getByText('1 level flagged · no longer warned · proposal accepted')
      .waitFor();
    const i1204 = (await flagsOf(castOf['CP-03'])).columns.pressure.indexOf(1204);
    expect((await flagsOf(castOf['CP-03'])).flags.salinity[i1204]).toBe(3);

    // undo from the flag log: the proposal is pending again, the level back to 2
    await log.getByRole('button', { name: /^Undo change/ }).click();
    await page.getByRole('heading', { name: 'Proposed flags · 1 pending' }).waitFor();
    await log.getByText('undone by #2').waitFor();
    expect((await flagsOf(castOf['CP-03'])).flags.salinity[i1204]).toBe(2);
    await page
      .getByRole('table', { name: 'Density inversions' })
      .getByText('still warned · proposal pending')
      .waitFor();
    await page.screenshot({ path: join(SHOTS, 'castsheet-flaglog-undo-1920.png'), fullPage: true });

    // a sideways drag on the temperature panel picks the pressure span it covers
    await page.setViewportSize({ width: 1280, height: 800 });
    await drawn(page);
    const plot = figure(page, 'Measured profiles of').locator('.js-plotly-plot');
    await plot.scrollIntoViewIfNeeded();
    const geo = await plot.evaluate((gd) => {
      const fl = (
        gd as unknown as {
          _fullLayout: {
            yaxis: { _offset: number; p2c: (px: number) => number };
            xaxis: { _offset: number; _length: number };
          };
        }
      )._fullLayout;
      const r = gd.getBoundingClientRect();
      return {
        left: r.left + fl.xaxis._offset,
        width: fl.xaxis._length,
        top: r.top + fl.yaxis._offset,
        p: [fl.yaxis.p2c(250), fl.yaxis.p2c(200), fl.yaxis.p2c(208)],
      };
    });
    const x0 = geo.left + geo.width * 0.1;
    const x1 = geo.left + geo.width * 0.9;
    const drag = async (ya: number, yb: number) => {
      await page.getByRole('button', { name: 'Pick the range on the plot' }).click();
      await page.mouse.move(x0, geo.top + ya);
      await page.mouse.down();
      await page.mouse.move((x0 + x1) / 2, geo.top + (ya + yb) / 2, { steps: 6 });
      await page.mouse.move(x1, geo.top + yb, { steps: 6 });
      await page.mouse.up();
    };
    // purely sideways (no height at all): the level nearest the drag, never "0 levels" (this failed before the fix)
    await drag(250, 250);
    await expect.poll(() => page.getByLabel('From (dbar)').inputValue(), { timeout: 10_000 }).not.toBe('1204');
    const one = Number(await page.getByLabel('From (dbar)').inputValue());
    expect(await page.getByLabel('To (dbar)').inputValue()).toBe(String(one));
    expect(Math.abs(one - geo.p[0])).toBeLessThanOrEqual(1.01);
    await page.getByText('1 level in the range').waitFor();
    // a shallow sideways drag, 8 px down across the panel: the levels of the pressure span those 8 px cover
    await drag(200, 208);
    await expect.poll(() => page.getByLabel('From (dbar)').inputValue(), { timeout: 10_000 }).not.toBe(String(one));
    const [, pa, pb] = geo.p;
    const from = Number(await page.getByLabel('From (dbar)').inputValue());
    const to = Number(await page.getByLabel('To (dbar)').inputValue());
    // the levels (2 dbar apart) inside the dragged span [pa, pb], within a pixel's worth of pressure
    const px = (pb - pa) / 8;
    expect(from).toBeGreaterThanOrEqual(pa - px);
    expect(from).toBeLessThan(pa + 2.01 + px);
    expect(to).toBeLessThanOrEqual(pb + px);
    expect(to).toBeGreaterThan(pb - 2.01 - px);
    const levels = Math.round((to - from) / 2) + 1;
    expect(levels).toBeGreaterThan(3);
    expect(levels).toBeLessThan(1000); // not the whole cast
    await page.getByLabel('Variable').selectOption('temperature');
    await page.getByLabel('Flag', { exact: true }).selectOption('3');
    await page.getByLabel(/^Reason/).fill('thermistor noise on the downcast');
    await page
      .getByTestId('flag-preview')
      .getByText(`Set flag will flag ${levels} levels of temperature as 3.`)
      .waitFor();
    await page.getByRole('button', { name: 'Set flag' }).click();
    await page.getByText(new RegExp(`Flag 3 set on ${levels} levels of temperature`)).waitFor();
    const after = await flagsOf(castOf['CP-03']);
    const flagged = after.columns.pressure.filter((p, i) => after.flags.temperature[i] === 3);
    expect(flagged[0]).toBe(from);
    expect(flagged[flagged.length - 1]).toBe(to);
    expect(flagged).toHaveLength(levels);
    await log.getByText('thermistor noise on the downcast').waitFor();
    await page.screenshot({ path: join(SHOTS, 'castsheet-sideways-flag-1280.png'), fullPage: true });

    // keys step casts: ] to the next station, } to the next cast with pending proposals (CP-11's overturn)
    await page.locator('body').press(']');
    await page.getByRole('heading', { name: /Station CP-04/ }).waitFor();
    await page.locator('body').press('}');
    await page.getByRole('heading', { name: /Station CP-11/ }).waitFor();
    await page.getByRole('heading', { name: /Proposed flags · \d+ pending/ }).waitFor();
    await page.locator('body').press('j');
    await page.locator('body').press('r');
    await page
      .getByRole('table', { name: 'Density inversions' })
      .getByText(/proposal rejected: kept as real/)
      .first()
      .waitFor();
    await page.screenshot({ path: join(SHOTS, 'castsheet-overturn-rejected-1280.png'), fullPage: true });

    expect(chromium.offLoopback).toEqual([]);
    await page.context().close();
  }, 200_000);
  it('follows the line chosen; overlays the same station in the earlier occupation; reopens a rejected proposal', async () => {
    const page = await chromium.newPage();
    await page.setViewportSize({ width: 1280, height: 800 });
    await signIn(page, srv.url, TECH, PASSWORD);
    await page.waitForURL((u) => !u.pathname.startsWith('/signin'));
    await page.goto(`${srv.url}/cruises/${cruiseId}/casts/${castOf['CP-03']}`);
    await page.getByRole('heading', { name: /Station CP-03/ }).waitFor();
    await drawn(page);
    // the default line has no earlier occupation (no section identifier in these files): nothing from 2016
    await page.getByText('Neighbours along the line “All stations”: previous CP-02, next CP-04.').waitFor();
    expect(await page.getByTestId('earlier-picker').count()).toBe(0);
    expect((await traceNames(page, 'Measured profiles of')).some((n) => n.startsWith('TS-16-02'))).toBe(false);

    // choose the line: the neighbours follow it, and its occupation in TS-16-02 is overlaid
    await page.getByTestId('line-picker').selectOption(lineOf.later);
    await page.getByText('Neighbours along the line “Corrow west”: previous CP-02, next CP-10.').waitFor();
    expect(new URL(page.url()).searchParams.get('line')).toBe(lineOf.later);
    const then = (await api.agent.get(`/api/casts/${earlierOf['CP-03']}`)).body as { time: string };
    const date = then.time.slice(0, 10);
    await page
      .getByTestId('earlier-text')
      .getByText(
        new RegExp(`^Then: station CP-03 of TS-16-02 \\(RV Tessellate\\), ${date}, \\d+\\.\\d km from this cast\\.$`),
      )
      .waitFor();
    await page.getByTestId('legend-earlier').getByText(`same station in TS-16-02 (${date}, CP-03)`).waitFor();
    await drawn(page);
    const name = `TS-16-02 · ${date} · CP-03`;
    await expect
      .poll(async () => (await traceNames(page, 'Measured profiles of')).filter((n) => n.startsWith(name)).length)
      .toBe(3); // t, SP, O₂ (the earlier cast has no fluorescence)
    expect((await traceNames(page, 'Profiles of')).filter((n) => n.startsWith(name)).length).toBe(4); // CT, SA, σ, N²
    expect(await traceNames(page, 'T–S diagram')).toEqual(
      expect.arrayContaining([name, 'previous · CP-02', 'next · CP-10']),
    );
    await page.getByRole('heading', { name: 'T–S diagram, with the neighbouring stations and TS-16-02' }).waitFor();
    await page.waitForLoadState('networkidle');
    await page.waitForTimeout(500);
    await page.screenshot({ path: join(SHOTS, 'castsheet-earlier-1280.png'), fullPage: false });
    await page.screenshot({ path: join(SHOTS, 'castsheet-earlier-1280-full.png'), fullPage: true });
    await page.getByRole('button', { name: 'Upper 1500 dbar' }).click();
    await page.waitForTimeout(800);
    await figure(page, 'Measured profiles of').screenshot({ path: join(SHOTS, 'castsheet-earlier-upper-1280.png') });
    await figure(page, 'Profiles of').screenshot({ path: join(SHOTS, 'castsheet-earlier-derived-upper-1280.png') });
    await figure(page, 'T–S diagram').screenshot({ path: join(SHOTS, 'castsheet-earlier-ts-1280.png') });
    // zoom (drag in zoom mode) into the SP panel where the earlier occupation parts from this cast (the planted
    // freshening of intermediate water in the invented demo, 900–1100 dbar)
    await figure(page, 'Measured profiles of').scrollIntoViewIfNeeded();
    const spBox = await figure(page, 'Measured profiles of')
      .locator('.js-plotly-plot')
      .evaluate((gd) => {
        type Ax = { _offset: number; c2p: (v: number) => number };
        const fl = (gd as unknown as { _fullLayout: { xaxis2: Ax; yaxis: Ax } })._fullLayout;
        const r = gd.getBoundingClientRect();
        const x = (v: number) => r.left + fl.xaxis2._offset + fl.xaxis2.c2p(v);
        const y = (v: number) => r.top + fl.yaxis._offset + fl.yaxis.c2p(v);
        return { x0: x(34.4), x1: x(34.8), y0: y(800), y1: y(1150) };
      });
    await page.mouse.move(spBox.x0, spBox.y0);
    await page.mouse.down();
    await page.mouse.move(spBox.x1, spBox.y1, { steps: 8 });
    await page.mouse.up();
    await page.mouse.move(5, 5);
    await page.waitForTimeout(800);
    await figure(page, 'Measured profiles of').screenshot({ path: join(SHOTS, 'castsheet-earlier-zoom-1280.png') });
    await page.getByRole('button', { name: 'Full depth' }).click();

    // the choice of earlier occupation can be switched off, and is kept in the URL
    await page.getByTestId('earlier-picker').selectOption('none');
    await expect
      .poll(async () => (await traceNames(page, 'Measured profiles of')).filter((n) => n.startsWith('TS-16-02')).length)
      .toBe(0);
    await page.getByTestId('earlier-picker').selectOption({ label: `TS-16-02 · ${date} · CP-03` });

    // the line stays chosen while stepping casts with the keys
    await page.locator('body').press(']');
    await page.getByRole('heading', { name: /Station CP-04/ }).waitFor();
    expect(new URL(page.url()).searchParams.get('line')).toBe(lineOf.later);

    // a rejected proposal is reopened with u: pending again, audited
    await page.goto(`${srv.url}/cruises/${cruiseId}/casts/${castOf['CP-11']}?line=${lineOf.later}`);
    await page.getByRole('heading', { name: /Station CP-11/ }).waitFor();
    const heading = page.getByRole('heading', { name: /^Proposed flags/ });
    await heading.waitFor();
    const pendingCount = async () => Number(/(\d+) pending/.exec((await heading.textContent()) ?? '')?.[1] ?? 0);
    // the test above rejected CP-11's proposal from the keyboard; if it did not get that far, reject one here
    const first = (await api.agent.get(`/api/casts/${castOf['CP-11']}/qc`)).body as {
      proposals: { id: string; status: string }[];
    };
    if (!first.proposals.some((p) => p.status === 'rejected')) {
      const id = first.proposals.find((p) => p.status === 'pending')!.id;
      const r = await api.agent
        .post(`/api/casts/${castOf['CP-11']}/qc/decisions`)
        .set('x-csrf-token', api.csrf)
        .send({ ids: [id], decision: 'reject' });
      expect(r.status).toBe(200);
      await page.reload();
      await heading.waitFor();
    }
    await expect.poll(async () => page.getByRole('button', { name: /^Reopen / }).count()).toBeGreaterThan(0);
    const before = await pendingCount();
    await drawn(page);
    await page.screenshot({ path: join(SHOTS, 'castsheet-rejected-reopen-1280.png'), fullPage: true });
    // J steps through every proposal (decided ones too) until the rejected one is current
    const qc = (await api.agent.get(`/api/casts/${castOf['CP-11']}/qc`)).body as {
      proposals: { id: string; status: string }[];
    };
    const rejected = qc.proposals.find((p) => p.status === 'rejected')!;
    for (let k = 0; k < qc.proposals.length; k++) {
      await page.locator('body').press('J');
      if ((await page.locator(`[data-proposal="${rejected.id}"]`).getAttribute('aria-current')) === 'true') break;
    }
    expect(await page.locator(`[data-proposal="${rejected.id}"]`).getAttribute('aria-current')).toBe('true');
    await page.locator('body').press('u');
    await expect.poll(pendingCount, { timeout: 15_000 }).toBe(before + 1);
    const trail = (await api.agent.get(`/api/cruises/${cruiseId}/audit`)).body as {
      action: string;
      entityId: string;
    }[];
    expect(trail.some((a) => a.action === 'qc_reopen' && a.entityId === rejected.id)).toBe(true);
    await page.context().close();

    // a member of the later cruise only: the same line, no earlier occupation
    const other = await chromium.newPage();
    await other.setViewportSize({ width: 1280, height: 800 });
    await signIn(other, srv.url, LATER_ONLY, PASSWORD);
    await other.waitForURL((u) => !u.pathname.startsWith('/signin'));
    await other.goto(`${srv.url}/cruises/${cruiseId}/casts/${castOf['CP-03']}?line=${lineOf.later}`);
    await other.getByText('Neighbours along the line “Corrow west”: previous CP-02, next CP-10.').waitFor();
    await drawn(other);
    expect(await other.getByTestId('earlier-picker').count()).toBe(0);
    expect(await other.getByTestId('legend-earlier').count()).toBe(0);
    expect((await traceNames(other, 'Measured profiles of')).some((n) => n.includes('TS-16-02'))).toBe(false);
    expect(await other.getByText('TS-16-02').count()).toBe(0);
    await other.screenshot({ path: join(SHOTS, 'castsheet-later-only-1280.png'), fullPage: false });
    expect(chromium.offLoopback).toEqual([]);
    await other.context().close();
  }, 200_000);
});
