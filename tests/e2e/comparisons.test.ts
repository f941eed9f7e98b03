// The "Then and now" screen in headless Chromium: the invented demo line occupied twice (a stretch of
// fixtures/demo-earlier TS-16-02 and fixtures/demo TS-26-04, through the intake), the earlier offered
// by its section identifier and chosen by itself, every frame drawn, the view in the URL (a reload
// of the copied URL gives the same view), screenshots at 1280×800 and 1920×1080. Requests that would
// leave loopback are blocked and counted; the test fails on any.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { startServer, launch, signIn, SHOTS } from './browser';
import { createUser, addMember, agentFor, waitFor, PASSWORD } from '../api/helpers';

const ANALYST = 'e2e-compare-analyst@example.test';
let srv: Awaited<ReturnType<typeof startServer>>;
let chromium: Awaited<ReturnType<typeof launch>>;
let cruiseB: string;

beforeAll(async () => {
  srv = await startServer({ LOG_LEVEL: 'error' });
  const { startWorkers } = await import('../../server/jobs/worker');
  const { Cruise } = await import('../../server/models/index');
  await startWorkers(srv.t.deps, { concurrency: 2 });
  const tech = await createUser('e2e-compare-tech@example.test');
  const analyst = await createUser(ANALYST, { name: 'Priya Castellane' });
  const t = await agentFor(srv.t.app, tech.email);
  const mk = async (name: string, start: string, dir: string) => {
    const c = await Cruise.create({
      name,
      ship: 'RV Tessellate',
      startDate: start,
      endDate: start,
      portStart: null,
      portEnd: null,
      region: null,
      description: null,
      createdBy: tech.id,
    });
    await addMember(tech.id, c.id, 'technician');
    await addMember(analyst.id, c.id, 'analyst');
    const files = readdirSync(dir)
      .filter((f) => {
        const n = Number(f.slice(3, 5));
        return n >= 10 && n <= 36;
      })
      .sort();
    let req = t.agent.post(`/api/cruises/${c.id}/uploads`).set('x-csrf-token', t.csrf);
    for (const f of files) req = req.attach('files', join(dir, f));
    expect((await req).status).toBe(202);
    await waitFor(
      async () => {
        const list = (await t.agent.get(`/api/cruises/${c.id}/uploads`)).body as { status: string }[];
        return list.length === files.length && list.every((u) => u.status === 'ready' || u.status === 'failed');
      },
      90_000,
      500,
    );
    return c.id;
  };
  await mk(
    'TS-16-02 Corrow Passage (first occupation)',
    '2016-03-02',
    join(process.cwd(), 'fixtures/demo-earlier/casts'),
  );
  cruiseB = await mk('TS-26-04 Corrow Passage section', '2026-03-01', join(process.cwd(), 'fixtures/demo/casts'));
  chromium = await launch();
}, 200_000);
afterAll(async () => {
  await chromium?.browser.close();
  await srv?.close();
});

describe('Then and now', () => {
  it('shows both occupations, the changes and the split, with the view in the URL', async () => {
    for (const [w, h] of [
      [1280, 800],
      [1920, 1080],
    ] as const) {
      const page = await chromium.newPage();
      await page.setViewportSize({ width: w, height: h });
      await signIn(page, srv.url, ANALYST, PASSWORD);
      await page.waitForURL((u) => !u.pathname.startsWith('/signin'), { timeout: 30_000 });
      await page.goto(`${srv.url}/cruises/${cruiseB}/then-and-now`);
      // the earlier cruise is found by its section identifier and put first, as A
      await page.waitForFunction(() => /[?&]a=[0-9a-f-]{36}.*&b=/.test(location.search), undefined, {
        timeout: 30_000,
      });
      for (const label of [
        'Conservative Temperature of A on pressure',
        'Conservative Temperature of B on pressure',
        'Change on pressure surfaces',
        'Change on isopycnals',
        'Heave of the isopycnals',
        'Water-mass term on pressure',
        'Heave term on pressure',
        'Along-line mean of each term',
        'T–S diagram of both',
      ]) {
        await page.locator(`figure[aria-label^="${label}"][data-plot-drawn]`).waitFor({ timeout: 60_000 });
      }
      await page.getByText(/10\.0 years apart/).waitFor({ timeout: 30_000 });
      await page.screenshot({ path: join(SHOTS, `then-and-now-${w}x${h}.png`), fullPage: false });
      await page.screenshot({ path: join(SHOTS, `then-and-now-${w}x${h}-full.png`), fullPage: true });
      if (w === 1280) {
        // a choice goes into the URL, and the URL alone gives the same view
        await page.getByLabel('Property').selectOption('SA');
        await page.waitForFunction(() => /property=SA/.test(location.search));
        const url = page.url();
        const again = await chromium.newPage();
        await signIn(again, srv.url, ANALYST, PASSWORD);
        await again.waitForURL((u) => !u.pathname.startsWith('/signin'), { timeout: 30_000 });
        await again.goto(url);
        await again
          .locator('figure[aria-label^="Absolute Salinity of A on pressure"][data-plot-drawn]')
          .waitFor({ timeout: 60_000 });
        expect(await again.getByLabel('Property').inputValue()).toBe('SA');
        await again.close();
        // positions along a drawn line: started from A's track, then shortened to its southern half
        await page.getByLabel('Positions along').selectOption('drawn');
        await page.getByRole('button', { name: "Start from A's track" }).click();
        await page.waitForFunction(() => /[?&]line=/.test(location.search));
        await page.getByText(/along a drawn line of \d+ points/).waitFor({ timeout: 60_000 });
        const field = page.getByLabel(/Drawn line/);
        const pts = (await field.inputValue()).split(';');
        await field.fill(pts.slice(0, Math.ceil(pts.length / 2)).join(';'));
        await field.blur();
        await page
          .getByText(/farther than 20 km from the drawn line/)
          .first()
          .waitFor({ timeout: 60_000 });
        await page.locator('figure[aria-label^="Change on pressure surfaces"][data-plot-drawn]').waitFor();
        await page.screenshot({ path: join(SHOTS, `then-and-now-drawn-${w}x${h}-full.png`), fullPage: true });
      }
      await page.close();
    }
    expect(chromium.offLoopback).toEqual([]);
  }, 240_000);
});
