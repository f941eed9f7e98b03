// The lock dialog on the cruise desk says what a lock freezes (docs/security.md, the lock).
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import { startServer, launch, signIn, SHOTS } from './browser';
import { createUser, addMember } from '../api/helpers';
import { Cruise } from '../../server/models/index';

let srv: Awaited<ReturnType<typeof startServer>>;
let b: Awaited<ReturnType<typeof launch>>;
let cruiseId: string;
beforeAll(async () => {
  srv = await startServer();
  const u = await createUser('lock-e2e@example.test');
  const c = await Cruise.create({
    name: 'RV Tessellate spring line',
    ship: 'RV Tessellate',
    startDate: '2026-04-01',
    endDate: '2026-04-21',
    portStart: 'Port Meridian',
    portEnd: 'Port Meridian',
    region: null,
    description: null,
    createdBy: u.id,
  });
  cruiseId = c.id;
  await addMember(u.id, c.id, 'chief_scientist');
  b = await launch();
}, 120_000);
afterAll(async () => {
  await b?.browser.close();
  await srv?.close();
});

describe('lock dialog', () => {
  it('names what a lock freezes and what stays open', async () => {
    for (const [w, h] of [
      [1280, 800],
      [1920, 1080],
    ] as const) {
      const page = await b.newPage();
      await page.setViewportSize({ width: w, height: h });
      await signIn(page, srv.url, 'lock-e2e@example.test', 'correct-horse-42');
      await page.waitForURL((u) => !u.pathname.startsWith('/signin'), { timeout: 30_000 });
      await page.goto(`${srv.url}/cruises/${cruiseId}`);
      await page
        .getByRole('button', { name: 'Lock cruise' })
        .click({ timeout: 60_000 })
        .catch(async (e) => {
          await page.screenshot({ path: join(SHOTS, 'lock-dialog-fail.png') });
          throw e;
        });
      const dialog = page.getByRole('group', { name: 'Confirm lock' });
      await expect(dialog.textContent()).resolves.toMatch(/No uploads.*quality flags.*stations.*stay open/);
      await page.screenshot({ path: join(SHOTS, `lock-dialog-${w}x${h}.png`) });
      await page.close();
    }
    expect(b.offLoopback).toEqual([]);
  }, 120_000);
});
