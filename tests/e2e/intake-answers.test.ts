// The answers step in Chromium (issue #12): two files dropped together lack a station, a cast, a
// position, a time and the unit of their oxygen column; the Intake screen asks once for the batch,
// previews the first rows with the answers applied (oxygen converted to µmol/kg), and "Retry with these
// answers" stores the casts. Screenshots go to /tmp/b-shots (or E2E_SHOTS).
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { startServer, launch, signIn } from './browser';
import { cruiseWithMember, PASSWORD } from '../api/helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cast } from '../../server/models/index';

const SHOTS = process.env.E2E_SHOTS ?? '/tmp/b-shots';
let srv: Awaited<ReturnType<typeof startServer>>;
let chromium: Awaited<ReturnType<typeof launch>>;
let cruiseId: string;
beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true });
  srv = await startServer();
  await startWorkers(srv.t.deps, { concurrency: 2 });
  chromium = await launch();
  ({ cruiseId } = await cruiseWithMember(
    'e2e-answers@example.test',
    'Ines Marrow',
    { name: 'Answers line', ship: 'RV Answer' },
    'technician',
  ));
}, 120_000);
afterAll(async () => {
  await chromium?.browser.close();
  await srv?.close();
});

/** An invented cast: oxygen in ml/l under a header that does not say so. */
function castFile(dir: string, name: string, header: string[], o2: number): string {
  const lines = [...header, 'pressure [dbar],temperature [ITS-90 degC],salinity [PSS-78],oxygen'];
  for (let i = 0; i < 60; i++)
    lines.push(
      `${2 + 4 * i},${(17.5 - 0.06 * i).toFixed(4)},${(35.1 - 0.003 * i).toFixed(4)},${(o2 - 0.01 * i).toFixed(3)}`,
    );
  const path = join(dir, name);
  writeFileSync(path, lines.join('\n') + '\n');
  return path;
}

describe('the answers step in Chromium', () => {
  it('asks once for the batch, previews the rows as they will be read, and retries with the answers', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-e2e-answers-'));
    const a = castFile(dir, 'drop-a.csv', ['# bottom_depth: 1200'], 5.8);
    const b = castFile(dir, 'drop-b.csv', ['# station: Q-2', '# latitude: -38.5', '# longitude: 14.25'], 5.4);
    const page = await chromium.newPage();
    await page.setViewportSize({ width: 1280, height: 1000 });
    await signIn(page, srv.url, 'e2e-answers@example.test', PASSWORD);
    await page.getByRole('heading', { name: 'Cruises', exact: true }).waitFor();
    await page.goto(`${srv.url}/cruises/${cruiseId}/intake`);
    await page.getByLabel('Cast files to upload').setInputFiles([a, b]);
    const form = page.getByRole('form', { name: 'What the files do not say' });
    await form.waitFor({ timeout: 60_000 });
    // both files in one step: one unit question for the oxygen column of both
    await expect.poll(async () => form.getByText('drop-b.csv').count(), { timeout: 30_000 }).toBeGreaterThan(0);
    expect(await form.getByLabel('Unit of column oxygen').count()).toBe(1);
    await expect.poll(async () => (await form.textContent()) ?? '').toMatch(/2 files of these 2 uploads/);
    expect(await form.textContent()).toMatch(/oxygen \(dissolved oxygen, 2 files\)/);
    await page.screenshot({ path: join(SHOTS, 'answers-asked.png'), fullPage: true });

    await form.getByLabel('Unit of column oxygen').selectOption('ml/l');
    await form.getByLabel('Station of drop-a.csv').fill('Q-1');
    await form.getByLabel('Cast of drop-a.csv').fill('3');
    await form.getByLabel('Latitude of drop-a.csv').fill('-38.25');
    await form.getByLabel('Longitude of drop-a.csv').fill('14.0');
    await form.getByLabel('Time (UTC) of drop-a.csv').fill('2026-03-07 04:15');
    await form.getByLabel('Time (UTC) of drop-b.csv').fill('2026-03-07T09:40');
    // the preview shows the answers applied and the oxygen per kilogram (5.8 ml/l × 44.661 = 259.0 µmol/l; per kg with σ0 ≈ 25.6 about 252.6 µmol/kg)
    await form.getByLabel('File to preview').selectOption('drop-a.csv');
    const table = form.getByRole('table', { name: 'Preview of drop-a.csv' });
    await expect
      .poll(async () => (await form.getByRole('region', { name: 'Preview' }).textContent()) ?? '', { timeout: 20_000 })
      .toMatch(/Q-1 \(your answer\)/);
    await expect.poll(async () => (await table.textContent()) ?? '', { timeout: 20_000 }).toMatch(/µmol\/kg/);
    const firstOxygen = Number(await table.locator('tbody tr').first().locator('td').nth(3).textContent());
    expect(firstOxygen).toBeGreaterThan(250);
    expect(firstOxygen).toBeLessThan(256);
    await page.screenshot({ path: join(SHOTS, 'answers-preview.png'), fullPage: true });

    // a wrong answer is refused with the server's message and nothing changes
    await form.getByLabel('Latitude of drop-a.csv').fill('95');
    await form.getByRole('button', { name: 'Retry with these answers' }).click();
    await form
      .getByText(/latitude must lie in -90\.\.90/)
      .first()
      .waitFor({ timeout: 20_000 });
    await page.screenshot({ path: join(SHOTS, 'answers-refused.png'), fullPage: true });
    expect(await Cast.count({ where: { cruiseId } })).toBe(0);
    await form.getByLabel('Latitude of drop-a.csv').fill('-38.25');
    await form.getByRole('button', { name: 'Retry with these answers' }).click();
    await expect.poll(async () => Cast.count({ where: { cruiseId } }), { timeout: 60_000 }).toBe(2);
    await form.waitFor({ state: 'detached', timeout: 30_000 });
    const q1 = await Cast.findOne({ where: { cruiseId, station: 'Q-1' } });
    expect(q1).toMatchObject({ cast: '3', latitude: -38.25, longitude: 14 });
    expect(q1!.time!.toISOString()).toBe('2026-03-07T04:15:00.000Z');
    await page
      .getByText(/2 files/)
      .first()
      .waitFor();
    await page.screenshot({ path: join(SHOTS, 'answers-done.png'), fullPage: true });
  }, 240_000);
});
