// Lines in headless Chromium on a stretch of the invented demo cruise: the analyst draws a polyline
// on the cruise desk map, the stations near it become a line, its section opens from the editor,
// and the Section screen's line picker switches back to the default line. Screenshots at 1280 × 800
// and 1920 × 1080. Every request that would leave loopback is blocked and counted.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { startServer, launch, signIn, SHOTS } from './browser';
import { createUser, addMember, agentFor, waitFor, PASSWORD } from '../api/helpers';

const ANALYST = 'e2e-lines-analyst@example.test';
let srv: Awaited<ReturnType<typeof startServer>>;
let chromium: Awaited<ReturnType<typeof launch>>;
let cruiseId: string;
const files = readdirSync(join(process.cwd(), 'fixtures/demo/casts')).sort().slice(0, 14);

beforeAll(async () => {
  srv = await startServer({ LOG_LEVEL: 'error' });
  const { startWorkers } = await import('../../server/jobs/worker');
  const { Cruise } = await import('../../server/models/index');
  await startWorkers(srv.t.deps, { concurrency: 2 });
  const tech = await createUser('e2e-lines-tech@example.test', { name: 'Ilse Varga' });
  const analyst = await createUser(ANALYST, { name: 'Piet Orrin' });
  const c = await Cruise.create({
    name: 'Cinder Plateau lines',
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
  let req = t.agent.post(`/api/cruises/${c.id}/uploads`).set('x-csrf-token', t.csrf);
  for (const f of files) req = req.attach('files', join(process.cwd(), 'fixtures/demo/casts', f));
  expect((await req).status).toBe(202);
  await waitFor(
    async () => {
      const list = (await t.agent.get(`/api/cruises/${c.id}/uploads`)).body as { status: string }[];
      return list.length === files.length && list.every((u) => u.status === 'ready');
    },
    90_000,
    500,
  );
  chromium = await launch();
}, 150_000);
afterAll(async () => {
  await chromium?.browser.close();
  await srv?.close();
});

/** Click the map at a station's point, offset a little so the click lands on the map, not the station. */
async function clickNear(page: Page, station: string, dx = 0, dy = 14) {
  const box = (await page.locator(`[data-station="${station}"]`).boundingBox())!;
  await page.locator('[data-testid="lines-map"]').click({
    position: await (async () => {
      const map = (await page.locator('[data-testid="lines-map"]').boundingBox())!;
      return { x: box.x + box.width / 2 - map.x + dx, y: box.y + box.height / 2 - map.y + dy };
    })(),
  });
}

describe('lines in Chromium', () => {
  it('draw a polyline on the desk map, open its section, switch lines', async () => {
    const page = await chromium.newPage();
    await signIn(page, srv.url, ANALYST, PASSWORD);
    await page.waitForURL((u) => !u.pathname.startsWith('/signin'));
    await page.goto(`${srv.url}/cruises/${cruiseId}`);
    await page.locator('[data-testid="lines-map"] [data-station="CP-03"]').waitFor({ timeout: 30_000 });
    await page.waitForLoadState('networkidle');
    await page.screenshot({ path: join(SHOTS, 'lines-desk-1280.png'), fullPage: true });

    await page.getByRole('button', { name: 'Draw a line' }).click();
    await clickNear(page, 'CP-03');
    await clickNear(page, 'CP-08');
    await page.getByLabel('Line name').fill('Drawn west stretch');
    await page.getByLabel('Corridor in km').fill('40');
    expect(await page.locator('[data-testid="drawn-polyline"]').count()).toBe(1);
    await page.getByRole('button', { name: /Take the stations near it/ }).click();
    const editor = page.locator('[data-testid="line-editor"]');
    await editor
      .getByRole('textbox', { name: 'Rename the line' })
      .and(page.locator('[value="Drawn west stretch"]'))
      .waitFor({ timeout: 20_000 });
    const rows = await editor.locator('tbody tr td:nth-child(2)').allTextContents();
    expect(rows).toEqual(['CP-03', 'CP-04', 'CP-05', 'CP-06', 'CP-07', 'CP-08']);
    await page.screenshot({ path: join(SHOTS, 'lines-drawn-1280.png'), fullPage: true });
    await page.setViewportSize({ width: 1920, height: 1080 });
    await page.screenshot({ path: join(SHOTS, 'lines-drawn-1920.png'), fullPage: true });
    await page.setViewportSize({ width: 1280, height: 800 });

    await editor.getByTestId('open-section').click();
    await page.waitForURL((u) => u.pathname.endsWith('/section') && u.searchParams.has('line'));
    await page.locator('figure[aria-label^="Section by pressure"][data-plot-drawn]').waitFor({ timeout: 30_000 });
    const picker = page.getByTestId('line-picker');
    expect(await picker.locator('option:checked').textContent()).toMatch(/Drawn west stretch · 6 stations/);
    await page.waitForLoadState('networkidle');
    await page.screenshot({ path: join(SHOTS, 'lines-section-drawn-1280.png'), fullPage: true });
    await page.setViewportSize({ width: 1920, height: 1080 });
    await page.screenshot({ path: join(SHOTS, 'lines-section-drawn-1920.png'), fullPage: true });

    const defaultId = await picker.locator('option', { hasText: '(default)' }).getAttribute('value');
    await picker.selectOption(defaultId!);
    await page.waitForURL((u) => !u.searchParams.has('line'));
    await page.waitForLoadState('networkidle');
    // the picker follows the URL once React has rendered the new view (slow on a loaded machine)
    await expect.poll(() => picker.locator('option:checked').textContent(), { timeout: 20_000 }).toMatch(/\(default\)/);
    await page.screenshot({ path: join(SHOTS, 'lines-section-default-1920.png'), fullPage: true });
    expect(chromium.offLoopback).toEqual([]);
  }, 120_000);
});
