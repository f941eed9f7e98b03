// The technician drops cast files on the Intake screen in Chromium: each file gets its own upload
// bar and then a processing status; a bad file comes back with its errors by file, line and
// column; a file with headers we do not know gets the column-mapping step and, mapped, is ingested.
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
  const u = await createUser('e2e-intake@example.test', { name: 'Ola Brennick' });
  const c = await Cruise.create({
    name: 'Intake line',
    ship: 'RV Intake',
    startDate: '2026-03-01',
    endDate: '2026-03-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: u.id,
  });
  cruiseId = c.id;
  await addMember(u.id, c.id, 'technician');
}, 120_000);
afterAll(async () => {
  await chromium?.browser.close();
  await srv?.close();
});

describe('Intake in Chromium', () => {
  it('uploads good, bad and unmapped files and shows each outcome', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-e2e-intake-'));
    const bad = join(dir, 'bad-values.csv');
    writeFileSync(
      bad,
      '# station: X1\n# latitude: -30\n# longitude: -20\npressure [dbar],temperature [ITS-90 degC],salinity [PSS-78]\n2,18.1,35.1\n4,18.0,thirty-five\n',
    );
    const odd = join(dir, 'odd-headers.csv');
    const rows = Array.from(
      { length: 50 },
      (_, i) => `${2 * (i + 1)},${(18 - i * 0.1).toFixed(3)},${(35.2 - i * 0.002).toFixed(4)}`,
    );
    writeFileSync(
      odd,
      `# station: X2\n# latitude: -30.5\n# longitude: -20.5\nprs_db,tmp_c,sal_psu\n${rows.join('\n')}\n`,
    );
    const page = await chromium.newPage();
    await signIn(page, srv.url, 'e2e-intake@example.test', PASSWORD);
    await page.getByRole('heading', { name: 'Cruises', exact: true }).waitFor();
    await page.goto(`${srv.url}/cruises/${cruiseId}/intake`);
    await page
      .getByLabel('Cast files to upload')
      .setInputFiles([join(process.cwd(), 'fixtures/samples/plain.csv'), bad, odd]);
    await page.getByRole('progressbar').first().waitFor();
    await page.screenshot({ path: join(SHOTS, 'intake-sending.png') });
    // the bad file: its error names file, line and column
    const errors = page.getByRole('list', { name: 'Errors in bad-values.csv' });
    await errors.waitFor({ timeout: 60_000 });
    expect(await errors.textContent()).toMatch(/line 6, column 3/);
    // the good file becomes a cast
    await expect.poll(async () => Cast.count({ where: { cruiseId } }), { timeout: 60_000 }).toBe(1);
    // the unknown headers: map them and the file is ingested
    await page
      .getByText(/prs_db/)
      .first()
      .waitFor({ timeout: 60_000 });
    await page.screenshot({ path: join(SHOTS, 'intake-outcomes.png'), fullPage: true });
    const selects = page.locator('select').filter({ has: page.locator('option[value="pressure"]') });
    const n = await selects.count();
    expect(n).toBeGreaterThanOrEqual(3);
    const roles = { prs_db: 'pressure', tmp_c: 'temperature', sal_psu: 'salinity' } as const;
    for (const [header, role] of Object.entries(roles)) await page.getByLabel(new RegExp(header)).selectOption(role);
    await page.getByRole('button', { name: 'Save mapping and process again' }).click();
    await expect.poll(async () => Cast.count({ where: { cruiseId } }), { timeout: 60_000 }).toBe(2);
    await page.screenshot({ path: join(SHOTS, 'intake-mapped.png'), fullPage: true });
    expect(chromium.offLoopback).toEqual([]);
  }, 180_000);
});
