// The chief scientist signs in, creates a cruise and invites a technician; the invitation is read
// from the SMTP fake; the technician follows the link, sets a password and sees the cruise.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { join } from 'node:path';
import { startServer, launch, signIn, SHOTS } from './browser';
import { createUser, caughtMail, waitFor, PASSWORD } from '../api/helpers';

let srv: Awaited<ReturnType<typeof startServer>>;
let chromium: Awaited<ReturnType<typeof launch>>;
beforeAll(async () => {
  srv = await startServer();
  chromium = await launch();
}, 120_000);
afterAll(async () => {
  await chromium?.browser.close();
  await srv?.close();
});

describe('foundation in Chromium', () => {
  it('chief creates a cruise and invites a technician who joins through the e-mailed link', async () => {
    await createUser('e2e-chief@example.test', { name: 'Wren Calloway' });
    const page = await chromium.newPage();
    await page.goto(`${srv.url}/`);
    await page.waitForURL(/\/signin/);
    await page.screenshot({ path: join(SHOTS, 'signin.png') });
    await signIn(page, srv.url, 'e2e-chief@example.test', PASSWORD);
    await page.getByRole('heading', { name: 'Cruises', exact: true }).waitFor();
    await page.waitForLoadState('networkidle');
    // with no cruise yet the create form is open; otherwise it opens from its button
    if (await page.getByRole('button', { name: 'New cruise' }).isVisible())
      await page.getByRole('button', { name: 'New cruise' }).click();
    await page.getByRole('button', { name: 'Create cruise' }).click();
    await page.getByText('Give the cruise a name.').waitFor(); // client-side validation, before any request
    await page.getByLabel('Cruise name').fill('Brindle Rise repeat line');
    await page.getByLabel('Ship').fill('RV Marram Lark');
    await page.getByLabel('Departure date').fill('2026-09-01');
    await page.getByLabel('Return date').fill('2026-09-24');
    await page.screenshot({ path: join(SHOTS, 'cruises-create.png') });
    await page.getByRole('button', { name: 'Create cruise' }).click();
    await page.waitForURL(/\/cruises\/[0-9a-f-]{36}/);
    const cruiseUrl = page.url();
    await page.getByText('Brindle Rise repeat line').first().waitFor();
    await page.screenshot({ path: join(SHOTS, 'cruise-desk-new.png') });
    await page.goto(`${cruiseUrl.replace(/\/$/, '')}/team`);
    await page.getByLabel('E-mail').fill('e2e-tech@example.test');
    await page.getByLabel('Role').selectOption('technician');
    await page.getByRole('button', { name: 'Review invitation' }).click();
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByText('e2e-tech@example.test').first().waitFor();
    await page.screenshot({ path: join(SHOTS, 'team.png') });

    // the SMTP fake keeps earlier runs' mail: take this server's invitation
    const mail = await waitFor(async () =>
      (await caughtMail()).filter((m) => m.to.includes('e2e-tech@example.test') && m.text.includes(srv.url)).at(-1),
    );
    const link = /(http:\/\/127\.0\.0\.1:\d+\/invite\/[\w-]+)/.exec(mail.text)![1];
    expect(link.startsWith(srv.url)).toBe(true);
    const techPage = await chromium.newPage();
    await techPage.goto(link);
    await techPage.getByLabel('Your name').fill('Juno Abernethy');
    await techPage.getByLabel('Choose a password').fill('marram-lark-2026');
    await techPage.screenshot({ path: join(SHOTS, 'invite-accept.png') });
    await techPage.getByRole('button', { name: 'Create account and join' }).click();
    await techPage
      .waitForURL((u) => !u.pathname.startsWith('/invite'), { timeout: 15_000 })
      .catch(async (err) => {
        await techPage.screenshot({ path: join(SHOTS, 'invite-accept-failed.png') });
        throw err;
      });
    await techPage.goto(`${srv.url}/`);
    await techPage.getByRole('table', { name: 'Your cruises' }).getByText('Brindle Rise repeat line').waitFor();
    await techPage.screenshot({ path: join(SHOTS, 'technician-cruises.png') });
    expect(await techPage.getByText(/technician/i).count()).toBeGreaterThan(0);
    expect(chromium.offLoopback).toEqual([]);
  }, 120_000);
});
