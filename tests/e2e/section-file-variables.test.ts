// The Section screen in Chromium offers the extra variables of the files (issue #12): three invented
// acquisition exports with fluorescence, beam transmission and a second sensor pair; the property
// control lists each with its unit, and fluorescence is drawn. Screenshots go to /tmp/b-shots (or E2E_SHOTS).
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { startServer, launch, signIn } from './browser';
import { cruiseWithMember, PASSWORD, waitFor } from '../api/helpers';
import { startWorkers } from '../../server/jobs/worker';
import { Cast, Upload } from '../../server/models/index';

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
    'e2e-fv@example.test',
    'Tomas Quill',
    { name: 'Sensor line', ship: 'RV Sensor' },
    'chief_scientist',
  ));
}, 120_000);
afterAll(async () => {
  await chromium?.browser.close();
  await srv?.close();
});

describe('extra variables on the Section screen', () => {
  it('lists each with its unit and draws fluorescence', async () => {
    const sample = readFileSync(join(process.cwd(), 'fixtures/samples/acquisition-two-pairs.txt'), 'utf8');
    const dir = mkdtempSync(join(tmpdir(), 'sl-e2e-fv-'));
    const files = [0, 1, 2].map((k) => {
      const path = join(dir, `k-1${k}.cnv`);
      writeFileSync(
        path,
        sample
          .replace('** Station: K-11', `** Station: K-1${k}`)
          .replace('NMEA Latitude = 34 07.50 S', `NMEA Latitude = 34 ${String(7 + 20 * k).padStart(2, '0')}.50 S`),
      );
      return path;
    });
    const page = await chromium.newPage();
    await page.setViewportSize({ width: 1400, height: 1000 });
    await signIn(page, srv.url, 'e2e-fv@example.test', PASSWORD);
    await page.getByRole('heading', { name: 'Cruises', exact: true }).waitFor();
    await page.goto(`${srv.url}/cruises/${cruiseId}/intake`);
    await page.getByLabel('Cast files to upload').setInputFiles(files);
    await expect.poll(async () => Cast.count({ where: { cruiseId } }), { timeout: 90_000 }).toBe(3);
    await waitFor(async () => (await Upload.count({ where: { cruiseId, status: 'ready' } })) === 3);
    await page.goto(`${srv.url}/cruises/${cruiseId}/section`);
    const property = page.getByLabel('Property');
    await property.waitFor();
    const options = page.locator('optgroup[label="Variables of the files"] option');
    await expect.poll(async () => options.count(), { timeout: 30_000 }).toBeGreaterThanOrEqual(4);
    const texts = await options.allTextContents();
    expect(texts).toContainEqual(expect.stringMatching(/^fluorescence \(mg\/m\^3\) — 3 casts$/));
    expect(texts).toContainEqual(expect.stringMatching(/^transmission \(%\)/));
    const drawn = page.waitForResponse(
      (r) => r.url().includes('/section?') && r.url().includes('property=x%3Afluorescence') && r.status() === 200,
      { timeout: 60_000 },
    );
    await property.selectOption('x:fluorescence');
    const body = (await (await drawn).json()) as { unit: string };
    expect(body.unit).toBe('mg/m^3');
    await page.waitForTimeout(4000);
    await page.screenshot({ path: join(SHOTS, 'section-fluorescence.png'), fullPage: true });
  }, 300_000);
});
