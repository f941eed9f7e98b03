// Cast life in Chromium: a corrected file for a live station and cast asks whether it replaces the
// earlier version; the chief scientist removes the cast from the cruise desk and restores it.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { startServer, launch, signIn, SHOTS } from './browser';
import { createUser, addMember, PASSWORD } from '../api/helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cast, Cruise } from '../../server/models/index';

let srv: Awaited<ReturnType<typeof startServer>>;
let chromium: Awaited<ReturnType<typeof launch>>;
let cruiseId: string;
beforeAll(async () => {
  srv = await startServer();
  await startWorkers(srv.t.deps, { concurrency: 2 });
  chromium = await launch();
  const u = await createUser('e2e-life@example.test', { name: 'Ines Farrow' });
  const c = await Cruise.create({
    name: 'Life line',
    ship: 'RV Tessellate',
    startDate: '2026-03-01',
    endDate: '2026-03-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: u.id,
  });
  cruiseId = c.id;
  await addMember(u.id, c.id, 'chief_scientist');
}, 120_000);
afterAll(async () => {
  await chromium?.browser.close();
  await srv?.close();
});

function castFile(dir: string, name: string, warm: number): string {
  const rows = Array.from({ length: 60 }, (_, i) => {
    const p = 2 + 2 * i;
    return `${p},${(4 + 16 * Math.exp(-p / 300) + warm).toFixed(4)},${(34.6 + Math.exp(-p / 250)).toFixed(4)}`;
  });
  const f = join(dir, name);
  writeFileSync(
    f,
    `# station: L7\n# cast: 1\n# latitude: -30.5\n# longitude: -20.25\n# time: 2026-03-04T05:00:00Z\npressure [dbar],temperature [ITS-90 degC],salinity [PSS-78]\n${rows.join('\n')}\n`,
  );
  return f;
}

describe('Cast life in Chromium', () => {
  it('replace asks first; remove and restore from the cruise desk', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-e2e-life-'));
    const page = await chromium.newPage();
    await signIn(page, srv.url, 'e2e-life@example.test', PASSWORD);
    await page.getByRole('heading', { name: 'Cruises', exact: true }).waitFor();
    await page.goto(`${srv.url}/cruises/${cruiseId}/intake`);
    await page.getByLabel('Cast files to upload').setInputFiles([castFile(dir, 'L7-first.csv', 0)]);
    await expect.poll(async () => Cast.count({ where: { cruiseId } }), { timeout: 60_000 }).toBe(1);
    const first = (await Cast.findOne({ where: { cruiseId } }))!.id;
    await page.getByLabel('Cast files to upload').setInputFiles([castFile(dir, 'L7-corrected.csv', 0.01)]);
    const replace = page.getByRole('button', { name: 'Replace the earlier versions' });
    await replace.waitFor({ timeout: 60_000 });
    await page.screenshot({ path: join(SHOTS, 'cast-life-replace-1280.png'), fullPage: true });
    await page.setViewportSize({ width: 1920, height: 1080 });
    await page.screenshot({ path: join(SHOTS, 'cast-life-replace-1920.png'), fullPage: true });
    await page.setViewportSize({ width: 1280, height: 800 });
    expect(await Cast.unscoped().count({ where: { cruiseId } })).toBe(1);
    await replace.click();
    await expect
      .poll(async () => (await Cast.findOne({ where: { cruiseId } }))?.id ?? first, { timeout: 60_000 })
      .not.toBe(first);
    expect(await Cast.unscoped().count({ where: { cruiseId } })).toBe(2);
    expect(await Cast.count({ where: { cruiseId } })).toBe(1);

    await page.goto(`${srv.url}/cruises/${cruiseId}`);
    const remove = page.getByRole('button', { name: 'Remove station L7 cast 1' });
    await remove.waitFor({ timeout: 30_000 });
    await remove.click();
    await expect.poll(async () => Cast.count({ where: { cruiseId } }), { timeout: 30_000 }).toBe(0);
    const restore = page.getByRole('button', { name: 'Restore station L7 cast 1' });
    await restore.waitFor({ timeout: 30_000 });
    await page.getByText('No casts yet').waitFor();
    await page.screenshot({ path: join(SHOTS, 'cast-life-removed-1280.png'), fullPage: true });
    await page.setViewportSize({ width: 1920, height: 1080 });
    await page.screenshot({ path: join(SHOTS, 'cast-life-removed-1920.png'), fullPage: true });
    await restore.click();
    await expect.poll(async () => Cast.count({ where: { cruiseId } }), { timeout: 30_000 }).toBe(1);
    await page.getByRole('button', { name: 'Remove station L7 cast 1' }).waitFor();
    await page.screenshot({ path: join(SHOTS, 'cast-life-restored-1920.png'), fullPage: true });
    expect(chromium.offLoopback).toEqual([]);
  }, 180_000);
});
