// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { buildRoutes } from '../../../src/App';
import { DEFAULT_FORM, canDeliver, validateDeliveryForm } from '../../../src/features/deliveries';
import { resetCsrfToken } from '../../../src/lib/http';
import { createQueryClient } from '../../../src/lib/queryClient';

function json(status: number, body: unknown): Response {
  return new Response(status === 204 ? null : JSON.stringify(body), {
    status,
    headers: { 'content-type': 'application/json' },
  });
}

const sets = [{ id: 'ls2', name: 'Deep water', referencePressure: 2000, levels: '36.9:0.02:37.1', count: 11 }];

describe('delivery form validation', () => {
  it('sends an isopycnal table with the layer set’s levels and reference pressure', () => {
    const r = validateDeliveryForm(
      { ...DEFAULT_FORM, layerSetId: 'ls2', ref: '0', inversions: 'drop', formats: ['csv', 'nc'] },
      sets,
    );
    expect(r).toEqual({
      ok: true,
      body: {
        kind: 'isopycnal',
        ref: 2000,
        levels: '36.9:0.02:37.1',
        inversions: 'drop',
        interpolation: 'linear',
        flags: [2],
        formats: ['csv', 'nc'],
      },
    });
  });

  it('sends the chosen reference pressure and no levels without a layer set, and no bin for an isopycnal table', () => {
    const r = validateDeliveryForm({ ...DEFAULT_FORM, ref: '1000', bin: 'nonsense' }, sets);
    expect(r.ok && r.body).toEqual({
      kind: 'isopycnal',
      ref: 1000,
      inversions: 'sort',
      interpolation: 'linear',
      flags: [2],
      formats: ['csv'],
    });
  });

  it('checks the bin of a pressure table and sends only what that kind uses', () => {
    expect(validateDeliveryForm({ ...DEFAULT_FORM, kind: 'pressure', bin: '' }, sets)).toEqual({
      ok: false,
      errors: { bin: 'Give the bin size in dbar.' },
    });
    expect(validateDeliveryForm({ ...DEFAULT_FORM, kind: 'pressure', bin: '0' }, sets)).toEqual({
      ok: false,
      errors: { bin: 'Bins are more than 0 and at most 500 dbar.' },
    });
    expect(validateDeliveryForm({ ...DEFAULT_FORM, kind: 'pressure', bin: '600' }, sets).ok).toBe(false);
    const r = validateDeliveryForm({ ...DEFAULT_FORM, kind: 'pressure', bin: '5', flags: [3, 2, 2] }, sets);
    expect(r).toEqual({ ok: true, body: { kind: 'pressure', bin: 5, flags: [2, 3], formats: ['csv'] } });
  });

  it('needs at least one flag and one format', () => {
    const r = validateDeliveryForm({ ...DEFAULT_FORM, flags: [], formats: [] }, sets);
    expect(r).toEqual({
      ok: false,
      errors: { flags: 'Include at least one quality flag.', formats: 'Choose at least one format.' },
    });
  });

  it('lets only a PI release; PIs, analysts and chief scientists build', () => {
    expect(['pi', 'chief_scientist', 'analyst', 'technician', null].map((r) => canDeliver.release(r))).toEqual([
      true,
      false,
      false,
      false,
      false,
    ]);
    expect(['pi', 'chief_scientist', 'analyst', 'technician', null].map((r) => canDeliver.build(r))).toEqual([
      true,
      true,
      true,
      false,
      false,
    ]);
  });
});

const ready = {
  id: 'd1',
  kind: 'isopycnal',
  params: { ref: 2000, levels: '36.9:0.02:37.1', inversions: 'sort', interpolation: 'linear', flags: [2] },
  formats: ['csv', 'nc'],
  status: 'ready',
  progress: 1,
  files: [
    { format: 'csv', filename: 'isopycnal-sigma2.csv', size: 48213, sha256: 'ab'.repeat(32) },
    { format: 'nc', filename: 'isopycnal-sigma2.nc', size: 90112, sha256: 'cd'.repeat(32) },
  ],
  released: false,
  releasedAt: null,
  releasedBy: null,
  createdBy: 'analyst@sigmaline.test',
  createdAt: '2026-03-20T10:00:00Z',
  error: null,
  canDownload: true,
};
const released = {
  ...ready,
  id: 'd0',
  released: true,
  releasedAt: '2026-03-19T08:00:00Z',
  releasedBy: 'pi@sigmaline.test',
};
const building = {
  ...ready,
  id: 'd2',
  kind: 'pressure',
  params: { bin: 2, flags: [2] },
  status: 'building',
  progress: 0.4,
  files: [],
};

let role = 'pi';
let posts: { url: string; body: unknown }[] = [];
let list: unknown[] = [];

beforeEach(() => {
  posts = [];
  list = [ready, released, building];
  resetCsrfToken();
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = new URL(String(input), 'http://localhost');
      const method = init?.method ?? 'GET';
      if (url.pathname === '/api/auth/csrf') return json(200, { token: 't' });
      if (url.pathname === '/api/auth/me')
        return json(200, {
          user: { id: 1, email: `${role}@sigmaline.test`, name: 'Ana Quill', isAdmin: false },
          memberships: [{ cruiseId: 5, role }],
        });
      if (url.pathname === '/api/cruises/5')
        return json(200, {
          id: 5,
          name: 'Meridian Drift 2026',
          ship: 'RV Halcyon Tern',
          startDate: '2026-03-01',
          endDate: '2026-03-28',
          role,
        });
      if (url.pathname === '/api/cruises/5/layer-sets') return json(200, sets);
      if (url.pathname === '/api/cruises/5/deliveries' && method === 'POST') {
        posts.push({ url: url.pathname, body: JSON.parse(String(init?.body)) });
        return json(202, { ...building, id: 'd3' });
      }
      if (url.pathname === '/api/cruises/5/deliveries') return json(200, list);
      if (url.pathname === '/api/deliveries/d1/release' && method === 'POST') {
        posts.push({ url: url.pathname, body: null });
        list = [
          { ...ready, released: true, releasedBy: 'pi@sigmaline.test', releasedAt: '2026-03-21T09:00:00Z' },
          released,
          building,
        ];
        return json(200, list[0]);
      }
      return json(404, { error: { code: 'not_found', message: 'Not found', details: [] } });
    }),
  );
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

async function renderDeliveries(as: string) {
  role = as;
  const queryClient = createQueryClient();
  const router = createMemoryRouter(buildRoutes(queryClient), { initialEntries: ['/cruises/5/deliveries'] });
  render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  await screen.findByRole('heading', { name: 'Deliveries' }, { timeout: 8000 });
  await screen.findAllByRole('heading', { name: /table/ }, { timeout: 8000 });
}

const itemOf = (name: RegExp) =>
  screen.getAllByRole('listitem').find((li) => within(li).queryByRole('heading', { name }))!;

describe('Deliveries screen', () => {
  it('shows a PI the release step, with what releasing means, and releases on confirmation', async () => {
    await renderDeliveries('pi');
    // Only the ready, unreleased delivery can be released.
    expect(screen.getAllByRole('button', { name: 'Release…' })).toHaveLength(1);
    fireEvent.click(screen.getByRole('button', { name: 'Release…' }));
    const dialog = screen.getByRole('alertdialog', { name: 'Release this delivery to the team?' });
    expect(dialog.textContent).toMatch(/e-mailed/);
    expect(dialog.textContent).toMatch(/frozen/);
    expect(posts).toHaveLength(0);
    fireEvent.click(within(dialog).getByRole('button', { name: 'Release and e-mail the team' }));
    await waitFor(() => expect(posts).toEqual([{ url: '/api/deliveries/d1/release', body: null }]));
    await waitFor(() => expect(screen.queryAllByRole('button', { name: 'Release…' })).toHaveLength(0));
  });

  it('never offers release to an analyst, who still builds and deletes unreleased deliveries', async () => {
    await renderDeliveries('analyst');
    expect(screen.queryByRole('button', { name: 'Release…' })).toBeNull();
    expect(screen.getByRole('form', { name: 'Build a delivery' })).toBeTruthy();
    expect(screen.getAllByRole('button', { name: /^Delete/ })).toHaveLength(2);
  });

  it('gives a technician no build form and no release', async () => {
    await renderDeliveries('technician');
    expect(screen.queryByRole('form', { name: 'Build a delivery' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Release…' })).toBeNull();
    expect(screen.queryByRole('button', { name: /^Delete/ })).toBeNull();
  });

  it('marks a released delivery locked, without delete, with who released it', async () => {
    await renderDeliveries('pi');
    const items = screen.getAllByRole('listitem').filter((li) => within(li).queryByLabelText('Released and locked'));
    expect(items).toHaveLength(1);
    expect(within(items[0]).queryByRole('button', { name: /^Delete/ })).toBeNull();
    expect(items[0].textContent).toMatch(/Released bypi@sigmaline\.test, 2026-03-19 08:00Z/);
  });

  it('shows progress while building and download links with provenance when ready', async () => {
    await renderDeliveries('pi');
    const bar = screen.getByRole('progressbar', { name: /Building the pressure-binned table/ });
    expect(bar.getAttribute('aria-valuenow')).toBe('40');
    const readyItem = itemOf(/^Isopycnal table$/);
    expect(within(readyItem).getByRole('link', { name: 'CSV' }).getAttribute('href')).toBe(
      '/api/deliveries/d1/download?format=csv',
    );
    expect(within(readyItem).getByRole('link', { name: 'NetCDF (CF-1.10)' }).getAttribute('href')).toBe(
      '/api/deliveries/d1/download?format=nc',
    );
    const provenance = within(readyItem).getByLabelText('Provenance');
    expect(provenance.textContent).toMatch(/σ2 · 2000 dbar/);
    expect(provenance.textContent).toMatch(/Deep water \(36\.9:0\.02:37\.1\)/);
    expect(provenance.textContent).toMatch(/2 good/);
    expect(provenance.textContent).toMatch(/analyst@sigmaline\.test, 2026-03-20 10:00Z/);
  });

  it('refuses to build without a flag or a format, then builds what the form says', async () => {
    await renderDeliveries('analyst');
    const form = screen.getByRole('form', { name: 'Build a delivery' });
    fireEvent.click(within(form).getByLabelText('Flag 2: good'));
    fireEvent.click(within(form).getByLabelText('CSV'));
    fireEvent.click(within(form).getByRole('button', { name: 'Build delivery' }));
    expect(await within(form).findByText('Include at least one quality flag.')).toBeTruthy();
    expect(within(form).getByText('Choose at least one format.')).toBeTruthy();
    expect(posts).toHaveLength(0);

    fireEvent.click(within(form).getByLabelText('Pressure-binned table', { exact: false }));
    fireEvent.change(within(form).getByLabelText('Pressure bin (dbar)'), { target: { value: '5' } });
    fireEvent.click(within(form).getByLabelText('Flag 2: good'));
    fireEvent.click(within(form).getByLabelText('Flag 3: questionable'));
    fireEvent.click(within(form).getByLabelText('Spreadsheet (.xlsx)'));
    fireEvent.click(within(form).getByRole('button', { name: 'Build delivery' }));
    await waitFor(() => expect(posts).toHaveLength(1));
    expect(posts[0].body).toEqual({ kind: 'pressure', bin: 5, flags: [2, 3], formats: ['xlsx'] });
  });
});
