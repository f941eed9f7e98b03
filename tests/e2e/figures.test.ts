// The section as a figure, in headless Chromium on the demo cruise (40 invented casts through the
// intake): no control that would send a figure to the plotting library's cloud, and no request off
// loopback while every toolbar button of both frames is pressed; the SVG and PDF exports carry the
// title, the caption shown under the frame and the provenance line; screenshots of each axis,
// palette and a fixed range with extensions for a person to read. pdftotext/pdftoppm (Debian's
// poppler-utils) read and render the PDF.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { execFileSync } from 'node:child_process';
import { readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { startServer, launch, signIn, SHOTS } from './browser';
import { createUser, addMember, agentFor, waitFor, PASSWORD } from '../api/helpers';

const ANALYST = 'e2e-figures-analyst@example.test';
const CRUISE = 'Cinder Plateau figures';
let srv: Awaited<ReturnType<typeof startServer>>;
let chromium: Awaited<ReturnType<typeof launch>>;
let cruiseId: string;

beforeAll(async () => {
  srv = await startServer({ LOG_LEVEL: 'error' });
  const { startWorkers } = await import('../../server/jobs/worker');
  const { Cruise } = await import('../../server/models/index');
  await startWorkers(srv.t.deps, { concurrency: 2 });
  const tech = await createUser('e2e-figures-tech@example.test', { name: 'Ilse Varga' });
  const analyst = await createUser(ANALYST, { name: 'Piet Orrin' });
  const c = await Cruise.create({
    name: CRUISE,
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
  const dir = join(process.cwd(), 'fixtures/demo/casts');
  const files = readdirSync(dir).sort();
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
  chromium = await launch();
}, 120_000);
afterAll(async () => {
  await chromium?.browser.close();
  await srv?.close();
});

async function open(query = '', viewport = { width: 1280, height: 800 }): Promise<Page> {
  const page = await chromium.newPage();
  await page.setViewportSize(viewport);
  await signIn(page, srv.url, ANALYST, PASSWORD);
  await page.waitForURL((u) => !u.pathname.startsWith('/signin'));
  await page.goto(`${srv.url}/cruises/${cruiseId}/section${query ? `?${query}` : ''}`);
  await page.locator('figure[data-frame][data-plot-interactive]').first().waitFor({ timeout: 45_000 });
  return page;
}

const interactive = (page: Page, frame: 'pressure' | 'density') =>
  page.locator(`figure[data-frame="${frame}"][data-plot-interactive]`).waitFor({ timeout: 45_000 });
const captionOf = async (page: Page, frame: 'pressure' | 'density') =>
  ((await page.locator(`figure[data-frame="${frame}"] figcaption`).textContent()) ?? '').replace(/\s+/g, ' ').trim();
const flat = (s: string) => s.replace(/\s+/g, ' ').trim();

async function shot(page: Page, name: string) {
  await page.waitForLoadState('networkidle');
  await page.waitForTimeout(300);
  await page.screenshot({ path: join(SHOTS, name) });
}

describe('the section as a figure', () => {
  it('has no cloud link or logo, and no request leaves loopback while every toolbar button is pressed', async () => {
    const page = await open();
    await interactive(page, 'pressure');
    await interactive(page, 'density');
    const cloud = /cloud|chart studio|edit in|plotly|produced with/i;
    for (const frame of ['pressure', 'density'] as const) {
      const fig = page.locator(`figure[data-frame="${frame}"]`);
      await fig.hover();
      const buttons = fig.locator('.modebar-btn');
      const count = await buttons.count();
      expect(count, 'the toolbar has buttons').toBeGreaterThan(3);
      const titles: string[] = [];
      for (let i = 0; i < count; i++) {
        const b = buttons.nth(i);
        const title = (await b.getAttribute('data-title')) ?? '';
        titles.push(title);
        expect(title).not.toMatch(cloud);
        expect(await b.getAttribute('href')).toBeNull();
        await fig.hover();
        // the "download as png" button writes a file: take it
        const download = /download|save/i.test(title) ? page.waitForEvent('download', { timeout: 15_000 }) : null;
        await b.click();
        if (download)
          expect((await download).suggestedFilename()).toMatch(/^Cinder-Plateau-figures_default-line_CT_by-/);
      }
      expect(titles.join(' ')).toMatch(/zoom/i);
      // no logo, no link out of the page, no on-graph "edit" link
      expect(await fig.locator('a.modebar-btn--logo, .js-plot-link-container, a[href^="http"]').count()).toBe(0);
    }
    const body = (await page.locator('body').textContent()) ?? '';
    expect(body).not.toMatch(/edit in chart studio|send data to cloud/i);
    expect(await page.locator('a[href*="plot.ly"], a[href*="plotly.com"]').count()).toBe(0);
    expect(chromium.offLoopback).toEqual([]);
    await page.context().close();
  }, 120_000);

  it('exports the section view as SVG and PDF with the title, the captions and the provenance', async () => {
    const page = await open('property=SA&stretch=1');
    await interactive(page, 'pressure');
    await interactive(page, 'density');
    const pressureCaption = await captionOf(page, 'pressure');
    const densityCaption = await captionOf(page, 'density');
    expect(pressureCaption).toMatch(/^Absolute Salinity \(g\/kg\) by pressure.*stretched.*[^.]\.$/);
    expect(densityCaption).toMatch(/[^.]\.$/);

    const menu = page.locator('[role="toolbar"][aria-label="Section figure"] [data-export-menu]');
    await menu.locator('summary').click();
    const take = async (format: 'SVG' | 'PDF' | 'PNG') => {
      const dl = page.waitForEvent('download', { timeout: 60_000 });
      await menu.getByRole('button', { name: `Save the section view as ${format}` }).click();
      const d = await dl;
      const path = join(SHOTS, `export-${d.suggestedFilename()}`);
      await d.saveAs(path);
      return { name: d.suggestedFilename(), path };
    };
    const svg = await take('SVG');
    expect(svg.name).toBe('Cinder-Plateau-figures_default-line_SA_section.svg');
    const svgText = readFileSync(svg.path, 'utf8');
    const textOf = (cls: string) =>
      flat(
        [...svgText.matchAll(new RegExp(`<text [^>]*class="${cls}"[^>]*>([^<]*)</text>`, 'g'))]
          .map((m) => m[1])
          .join(' '),
      )
        .replace(/&amp;/g, '&')
        .replace(/&lt;/g, '<')
        .replace(/&gt;/g, '>')
        .replace(/&quot;/g, '"');
    expect(textOf('caption')).toContain(pressureCaption);
    expect(textOf('caption')).toContain(densityCaption);
    expect(textOf('provenance')).toMatch(
      new RegExp(
        `Cruise ${CRUISE} \\(RV Fathom Wren\\) · default line .* · Sigmaline \\d+\\.\\d+\\.\\d+ · drawn \\d{4}-\\d\\d-\\d\\d \\d\\d:\\d\\d UTC`,
      ),
    );
    expect(svgText).toContain(`${CRUISE}: Absolute Salinity section`);

    // Look at the SVG as a browser draws it.
    const viewer = await chromium.newPage();
    await viewer.setViewportSize({ width: 1100, height: 1200 });
    await viewer.setContent(`<body style="margin:0">${svgText.replace(/^<\?xml[^>]*>/, '')}</body>`);
    await viewer.screenshot({ path: join(SHOTS, 'export-svg-rendered.png'), fullPage: true, timeout: 90_000 });
    await viewer.context().close();

    const pdf = await take('PDF');
    expect(pdf.name).toBe('Cinder-Plateau-figures_default-line_SA_section.pdf');
    expect(readFileSync(pdf.path).subarray(0, 8).toString('latin1')).toBe('%PDF-1.4');
    const pdfText = flat(execFileSync('pdftotext', ['-layout', pdf.path, '-'], { encoding: 'utf8' }));
    // The PDF's standard font spells σ out; the rest of the caption is as on screen.
    const asPdf = (s: string) => s.replace(/σ/g, 'sigma').replace(/[₀-₉]/g, (c) => String(c.charCodeAt(0) - 0x2080));
    const squash = (s: string) => s.replace(/\s+/g, '');
    expect(squash(pdfText)).toContain(squash(asPdf(pressureCaption)));
    expect(squash(pdfText)).toContain(squash(asPdf(densityCaption)));
    expect(pdfText).toContain(`Cruise ${CRUISE} (RV Fathom Wren)`);
    expect(pdfText).toMatch(/Sigmaline \d+\.\d+\.\d+/);
    execFileSync('pdftoppm', ['-png', '-r', '60', '-singlefile', pdf.path, join(SHOTS, 'export-pdf-rendered')]);

    const png = await take('PNG');
    expect(png.name).toMatch(/_section\.png$/);
    const bytes = readFileSync(png.path);
    expect(bytes.subarray(1, 4).toString('latin1')).toBe('PNG');
    // 200 dpi by default: 1100 css px wide → 1100 × 200 / 96 ≈ 2292 pixels
    expect(bytes.readUInt32BE(16)).toBe(Math.round((1100 * 200) / 96));
    expect(chromium.offLoopback).toEqual([]);
    await page.context().close();
  }, 180_000);

  it('draws each axis, palette and a fixed range with extensions (screenshots to read)', async () => {
    const cases: [string, string][] = [
      ['figure-contours-labelled.png', 'cint=0.5'],
      ['figure-depth-axis.png', 'yax=depth'],
      ['figure-stretched-upper-ocean.png', 'stretch=1&property=SA'],
      ['figure-latitude-axis.png', 'xax=latitude'],
      ['figure-palette-hearth.png', 'pal=hearth'],
      ['figure-palette-brine.png', 'pal=brine&property=SA'],
      ['figure-palette-cleft.png', 'pal=cleft&property=spiciness0'],
      ['figure-palette-graphite.png', 'pal=graphite'],
      ['figure-fixed-range-extensions.png', 'cmin=4&cmax=10&dmin=4&dmax=10'],
    ];
    const page = await open();
    for (const [name, query] of cases) {
      await page.goto(`${srv.url}/cruises/${cruiseId}/section?${query}`);
      await page.locator('figure[data-frame][data-plot-interactive]').first().waitFor({ timeout: 45_000 });
      if (!query.includes('show=')) await interactive(page, 'density');
      await shot(page, name);
    }
    // The fixed range leaves values out at both ends: both triangles are on the bar, the caption says so.
    await page.goto(`${srv.url}/cruises/${cruiseId}/section?cmin=4&cmax=10`);
    await interactive(page, 'pressure');
    const shapes = await page
      .locator('figure[data-frame="pressure"] .js-plotly-plot')
      .evaluate((gd) =>
        ((gd as unknown as { layout: { shapes?: { name?: string }[] } }).layout.shapes ?? [])
          .map((s) => s.name)
          .filter(Boolean),
      );
    expect(shapes).toEqual(expect.arrayContaining(['extension above', 'extension below']));
    expect(await captionOf(page, 'pressure')).toMatch(
      /colour range fixed at 4 to 10, values beyond it drawn in the end colours \(\d+ cells below, \d+ above/,
    );
    // Depth ticks are depths: the axis title says metres.
    await page.goto(`${srv.url}/cruises/${cruiseId}/section?yax=depth`);
    await interactive(page, 'pressure');
    const yTitle = await page
      .locator('figure[data-frame="pressure"] .js-plotly-plot')
      .evaluate((gd) => (gd as unknown as { layout: { yaxis: { title: { text: string } } } }).layout.yaxis.title.text);
    expect(yTitle).toBe('Depth (m)');
    // Both frames are visible without scrolling at 1280 × 800.
    const boxes = await Promise.all(
      (['pressure', 'density'] as const).map((f) =>
        page.locator(`figure[data-frame="${f}"] .js-plotly-plot`).boundingBox(),
      ),
    );
    for (const b of boxes) expect(b && b.y + b.height).toBeLessThanOrEqual(800);
    await shot(page, 'figure-1280x800.png');
    await page.setViewportSize({ width: 1920, height: 1080 });
    await page.waitForTimeout(800);
    await shot(page, 'figure-1920x1080.png');
    await page.emulateMedia({ media: 'print' });
    await shot(page, 'figure-print.png');
    writeFileSync(join(SHOTS, 'figures-done.txt'), new Date().toISOString());
    expect(chromium.offLoopback).toEqual([]);
    await page.context().close();
  }, 420_000);
});
