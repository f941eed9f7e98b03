// Headless Debian Chromium driven by playwright-core against the real app served in-process on
// loopback. Every request that would leave loopback is blocked and counted.
import { chromium, type Browser, type Page } from 'playwright-core';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { makeTestApp, type TestApp } from '../api/helpers';

export const SHOTS = join(process.cwd(), 'screenshots');

export async function startServer(
  env: Record<string, string> = {},
): Promise<{ t: TestApp; url: string; close(): Promise<void> }> {
  const probe = await import('node:net').then(
    (net) =>
      new Promise<number>((resolve) => {
        const s = net.createServer().listen(0, '127.0.0.1', () => {
          const p = (s.address() as AddressInfo).port;
          s.close(() => resolve(p));
        });
      }),
  );
  const url = `http://127.0.0.1:${probe}`;
  const t = await makeTestApp({ PUBLIC_URL: url, ...env });
  const { createApp } = await import('../../server/app');
  const app = createApp(t.deps, { staticDir: join(process.cwd(), 'dist') });
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(probe, '127.0.0.1', () => resolve(s));
  });
  return {
    t,
    url,
    async close() {
      await new Promise((r) => server.close(r));
      await app.close();
      await t.close();
    },
  };
}

export async function launch(): Promise<{ browser: Browser; newPage(): Promise<Page>; offLoopback: string[] }> {
  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
      '--disable-quic',
    ],
  });
  const offLoopback: string[] = [];
  mkdirSync(SHOTS, { recursive: true });
  return {
    browser,
    offLoopback,
    async newPage() {
      const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
      await context.route('**/*', (route) => {
        const u = new URL(route.request().url());
        if (
          u.protocol === 'data:' ||
          u.protocol === 'blob:' ||
          ['127.0.0.1', 'localhost', '[::1]'].includes(u.hostname)
        )
          return route.continue();
        offLoopback.push(route.request().url());
        return route.abort();
      });
      return context.newPage();
    },
  };
}

export async function signIn(page: Page, url: string, email: string, password: string) {
  await page.goto(`${url}/signin`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  // Signed in once the screen has left the sign-in page (a caller's next goto must carry the cookie).
  await page.waitForURL((u) => !u.pathname.startsWith('/signin'), { timeout: 30_000 });
}
