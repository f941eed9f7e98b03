// The station plan in Chromium: the chief scientist pastes a station table (degrees and decimal
// minutes), reads the preview of what it would change, applies it, reorders the plan with the arrows,
// edits a station, meets the explanation when removing an occupied one; and the cast sheet shows the
// history of a replaced cast. Invented stations and casts; no real data here.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { startServer, launch, signIn } from './browser';
import { createUser, addMember, PASSWORD } from '../api/helpers';
import { startWorkers } from '../../server/jobs/worker';
import { AuditEntry, Cast, Cruise, Station } from '../../server/models/index';

const SHOTS = '/tmp/a-shots';
let srv: Awaited<ReturnType<typeof startServer>>;
let chromium: Awaited<ReturnType<typeof launch>>;
let cruiseId: string;
beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true });
  srv = await startServer();
  await startWorkers(srv.t.deps, { concurrency: 2 });
  chromium = await launch();
  const u = await createUser('e2e-plan@example.test', { name: 'Mara Lindqvist' });
  const c = await Cruise.create({
    name: 'Plan line',
    ship: 'RV Meridian Step',
    startDate: '2026-05-01',
    endDate: '2026-05-20',
    portStart: null,
    portEnd: null,
    region: null,
    description: null,
    createdBy: u.id,
  });
  cruiseId = c.id;
  await addMember(u.id, c.id, 'chief_scientist');
  await Station.bulkCreate([
    { cruiseId, name: 'K1', latitude: -54, longitude: -58, plannedDepth: 3800, order: 1 },
    { cruiseId, name: 'K2', latitude: -54.5, longitude: -58, plannedDepth: 4000, order: 2 },
    { cruiseId, name: 'K9', latitude: -50, longitude: -50, plannedDepth: null, order: 3 },
  ]);
}, 120_000);
afterAll(async () => {
  await chromium?.browser.close();
  await srv?.close();
});

function castFile(dir: string, name: string, station: string, o: { warm?: number; skip?: number[] } = {}): string {
  const rows: string[] = [];
  for (let p = 2; p <= 120; p += 2) {
    if (o.skip?.includes(p)) continue;
    rows.push(
      `${p},${(4 + 16 * Math.exp(-p / 300) + (o.warm ?? 0)).toFixed(4)},${(34.6 + Math.exp(-p / 250)).toFixed(4)}`,
    );
  }
  const f = join(dir, name);
  writeFileSync(
    f,
    `# station: ${station}\n# cast: 1\n# latitude: -54\n# longitude: -58\n# time: 2026-05-04T05:00:00Z\npressure [dbar],temperature [ITS-90 degC],salinity [PSS-78]\n${rows.join('\n')}\n`,
  );
  return f;
}

const planNames = async () =>
  (await Station.findAll({ where: { cruiseId }, order: [['order', 'ASC']] })).map((s) => s.name);

describe('Station plan in Chromium', () => {
  it('pastes a table, reads the preview, applies it, reorders and edits the plan', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-e2e-plan-'));
    const page = await chromium.newPage();
    await signIn(page, srv.url, 'e2e-plan@example.test', PASSWORD);
    await page.getByRole('heading', { name: 'Cruises', exact: true }).waitFor();
    // K1 gets a cast, so it is occupied
    await page.goto(`${srv.url}/cruises/${cruiseId}/intake`);
    await page.getByLabel('Cast files to upload').setInputFiles([castFile(dir, 'K1-a.csv', 'K1')]);
    await expect.poll(async () => Cast.count({ where: { cruiseId } }), { timeout: 60_000 }).toBe(1);

    await page.goto(`${srv.url}/cruises/${cruiseId}`);
    const table = page.getByRole('table', { name: 'Planned stations' });
    await table.waitFor();
    const box = page.getByLabel('Station table', { exact: true });
    // a bad row first: the line and column are named, nothing is previewed
    await box.fill('station\tlat\tlon\tdepth\nK1\t54 00.0 S\t58 00.0 W\t3800\nK3\t55 61.0 S\t58 W\t4100');
    await page.getByRole('button', { name: 'Preview changes' }).click();
    const alert = page.getByRole('alert').filter({ hasText: 'The table was not read' });
    await alert.waitFor();
    expect(await alert.textContent()).toMatch(/line 3, column 2: latitude: minutes are under 60/);
    await page.screenshot({ path: join(SHOTS, 'plan-bad-row.png'), fullPage: true });

    // the good table: K2 moves (degrees and minutes), K3 and K4 are new; in "whole plan" mode K9 goes
    await box.fill(
      [
        'station\tlat\tlon\tdepth',
        "K1\t54°00.0'S\t58°00.0'W\t3800",
        'K2\t54 45.0 S\t58 00.0 W\t4000',
        'K3\t-55.0\t-58.0\t4100',
        'K4\t55 15.5 S\t057 59.5 W\t',
      ].join('\n'),
    );
    await page.getByLabel('The table is').selectOption('replace');
    await page.getByRole('button', { name: 'Preview changes' }).click();
    const preview = page.getByRole('table', { name: 'Preview of the plan change' });
    await preview.waitFor();
    const text = (await preview.textContent()) ?? '';
    expect(text).toMatch(/addedK3/);
    expect(text).toMatch(/addedK4/);
    expect(text).toMatch(/changedK2.*latitude.*54\.5000°\s*S → 54\.7500°\s*S/);
    expect(text).toMatch(/removedK9/);
    const summary = (await page.getByLabel('What the table would change').textContent()) ?? '';
    expect(summary).toMatch(/add 2, change 1 and remove 1 station/);
    // nothing has changed yet
    expect(await planNames()).toEqual(['K1', 'K2', 'K9']);
    await page.getByRole('button', { name: 'Apply these changes' }).scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(SHOTS, 'plan-preview.png'), fullPage: true });
    await page.getByRole('button', { name: 'Apply these changes' }).click();
    await page.getByText(/Applied: 2 stations added, 1 changed, 1 removed/).waitFor();
    expect(await planNames()).toEqual(['K1', 'K2', 'K3', 'K4']);
    const k2 = await Station.findOne({ where: { cruiseId, name: 'K2' } });
    expect(k2!.latitude).toBe(-54.75);
    expect(await AuditEntry.count({ where: { cruiseId, action: 'import_stations' } })).toBe(1);
    await expect.poll(async () => (await table.locator('tbody tr').allTextContents()).length).toBe(4);

    // reorder: K4 up twice → K1 K4 K2 K3
    await page.getByRole('button', { name: 'Move station K4 up' }).click();
    await expect.poll(planNames).toEqual(['K1', 'K2', 'K4', 'K3']);
    await page.getByRole('button', { name: 'Move station K4 up' }).click();
    await expect.poll(planNames).toEqual(['K1', 'K4', 'K2', 'K3']);
    await expect
      .poll(async () => (await table.locator('tbody tr td:nth-child(2)').allTextContents()).join(' '))
      .toBe('K1 K4 K2 K3');

    // edit K3's depth, in place
    await page.getByRole('button', { name: 'Edit station K3' }).click();
    await page.getByLabel('Depth (m)', { exact: true }).fill('4150');
    await page.getByLabel('Latitude', { exact: true }).fill('55 01.2 S');
    await page.getByRole('button', { name: 'Save' }).click();
    await expect
      .poll(async () => (await Station.findOne({ where: { cruiseId, name: 'K3' } }))!.plannedDepth)
      .toBe(4150);
    expect((await Station.findOne({ where: { cruiseId, name: 'K3' } }))!.latitude).toBeCloseTo(-55.02, 12);

    // removing the occupied K1 is explained, not done
    await page.getByRole('button', { name: 'Remove station K1', exact: true }).click();
    const dialog = page.getByRole('alertdialog', { name: 'Remove station K1', exact: true });
    await dialog.waitFor();
    expect(await dialog.textContent()).toMatch(/has casts, so it stays in the plan/);
    await page.screenshot({ path: join(SHOTS, 'plan-remove-occupied.png'), fullPage: true });
    await dialog.getByRole('button', { name: 'Close' }).click();
    // removing K4 (no cast) asks first
    await page.getByRole('button', { name: 'Remove station K4', exact: true }).click();
    await page.getByRole('button', { name: 'Remove K4', exact: true }).click();
    await expect.poll(planNames).toEqual(['K1', 'K2', 'K3']);
    await page.setViewportSize({ width: 1920, height: 1080 });
    await page.screenshot({ path: join(SHOTS, 'plan-desk-1920.png'), fullPage: true });
    await page.close();
  }, 240_000);

  it('the cast sheet shows the history of a replaced cast', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'sl-e2e-hist-'));
    const page = await chromium.newPage();
    await signIn(page, srv.url, 'e2e-plan@example.test', PASSWORD);
    await page.getByRole('heading', { name: 'Cruises', exact: true }).waitFor();
    const first = (await Cast.findOne({ where: { cruiseId, station: 'K1' } }))!.id;
    // flag 10–20 dbar questionable through the API the sheet uses
    const csrf = await page.evaluate(async () => (await (await fetch('/api/auth/csrf')).json()).token as string);
    const flagged = await page.evaluate(
      async ([id, token]) =>
        (
          await fetch(`/api/casts/${id}/flags`, {
            method: 'POST',
            headers: { 'content-type': 'application/json', 'x-csrf-token': token },
            body: JSON.stringify({ variable: 'temperature', pFrom: 10, pTo: 20, flag: 3 }),
          })
        ).status,
      [first, csrf],
    );
    expect(flagged).toBe(200);
    await page.goto(`${srv.url}/cruises/${cruiseId}/intake`);
    await page
      .getByLabel('Cast files to upload')
      .setInputFiles([castFile(dir, 'K1-b.csv', 'K1', { warm: 0.01, skip: [12, 14] })]);
    const replace = page.getByRole('button', { name: 'Replace the earlier versions' });
    await replace.waitFor({ timeout: 60_000 });
    await replace.click();
    await expect
      .poll(async () => (await Cast.findOne({ where: { cruiseId, station: 'K1' } }))?.id ?? first, { timeout: 60_000 })
      .not.toBe(first);
    const live = (await Cast.findOne({ where: { cruiseId, station: 'K1' } }))!.id;
    await page.goto(`${srv.url}/cruises/${cruiseId}/casts/${live}`);
    const versions = page.getByRole('list', { name: 'Versions of this cast' });
    await versions.waitFor({ timeout: 30_000 });
    const items = await versions.getByRole('listitem').allTextContents();
    expect(items).toHaveLength(2);
    expect(items[0]).toMatch(/1\. K1-a\.csv\s*replaced/);
    expect(items[0]).toMatch(/Mara Lindqvist/);
    expect(items[1]).toMatch(/2\. K1-b\.csv\s*live/);
    expect(items[1]).toMatch(
      /Replaced K1-a\.csv: 4 flagged levels carried over; 2 not carried \(no level at 12, 14 dbar/,
    );
    await versions.scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(SHOTS, 'castsheet-history.png'), fullPage: true });
    await page.close();
  }, 240_000);
});
