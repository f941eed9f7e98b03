// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { act, cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import type { ReactNode } from 'react';

// Plotly does not run in jsdom; the stand-in keeps the figure's label and caption and lets a test
// "hover" a point, which is all the screen's own logic sees of a plot.
vi.mock('../../../src/components/plot', async (importOriginal) => {
  const actual = await importOriginal<typeof import('../../../src/components/plot')>();
  return {
    ...actual,
    LazyPlot: ({ label, caption, onHover }: { label: string; caption?: ReactNode; onHover?: (e: unknown) => void }) => (
      <figure aria-label={label}>
        <button type="button" onClick={() => onHover?.({ points: [{ x: 41, y: 95 }] })}>
          hover {label}
        </button>
        <figcaption>{caption}</figcaption>
      </figure>
    ),
  };
});

const { buildRoutes } = await import('../../../src/App');
const { resetCsrfToken } = await import('../../../src/lib/http');
const { createQueryClient } = await import('../../../src/lib/queryClient');

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

const analyst = {
  user: { id: 3, email: 'analyst@sigmaline.test', name: 'Tomas Ekwall', isAdmin: false },
  memberships: [{ cruiseId: 5, role: 'analyst' }],
};
const cruise = {
  id: 5,
  name: 'Meridian Drift 2026',
  ship: 'RV Halcyon Tern',
  startDate: '2026-03-01',
  endDate: '2026-03-28',
  role: 'analyst',
};
const stations = [
  { id: 'c1', station: 'MD-01', cast: '1', x: 0, latitude: -30, longitude: 10, bottom: 300, deepest: 290 },
  { id: 'c2', station: 'MD-02', cast: '1', x: 40, latitude: -30.3, longitude: 10.1, bottom: 300, deepest: 290 },
  { id: 'c3', station: 'MD-03', cast: '1', x: 80, latitude: -30.6, longitude: 10.2, bottom: 300, deepest: 290 },
];

function section(q: URLSearchParams) {
  const density = q.get('coord') === 'density';
  return {
    choices: {
      property: q.get('property'),
      coord: q.get('coord'),
      ref: Number(q.get('ref')),
      sigma: `sigma${Number(q.get('ref')) / 1000}`,
      levels: q.get('levels') ?? '23.0:0.05:27.9',
      inversions: q.get('inversions'),
      interpolation: q.get('interpolation'),
      bin: 10,
      gapFactor: 1.5,
      threshold: 0.01,
    },
    unit: '°C',
    grid: {
      x: [0, 40, 80],
      y: density ? [26, 26.5, 27] : [0, 100, 200],
      z: [
        [20, 19, 18],
        [12.5, 11.25, 10],
        [5, 4.5, 4],
      ],
    },
    stations,
    bottom: [
      { x: 0, p: 300 },
      { x: 80, p: 300 },
    ],
    inversions: [
      {
        castId: 'c2',
        station: 'MD-02',
        x: 40,
        pTop: 120,
        pBottom: 128,
        deficit: 0.021,
        class: 'spike',
        sigmaTop: 26.61,
        sigmaBottom: 26.59,
      },
    ],
    isopycnals: density ? [] : [{ sigma: 26.5, p: [80, 100, 120] }],
  };
}

let sectionRequests: URLSearchParams[] = [];
let viewPosts: unknown[] = [];

beforeEach(() => {
  sectionRequests = [];
  viewPosts = [];
  resetCsrfToken();
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
      const url = new URL(String(input), 'http://localhost');
      const method = init?.method ?? 'GET';
      if (url.pathname === '/api/auth/csrf') return json(200, { token: 't' });
      if (url.pathname === '/api/auth/me') return json(200, analyst);
      if (url.pathname === '/api/cruises/5') return json(200, cruise);
      if (url.pathname === '/api/cruises/5/layer-sets')
        return json(200, [
          { id: 'ls1', name: 'Deep water', referencePressure: 2000, levels: '36.9:0.02:37.1', count: 11 },
        ]);
      if (url.pathname === '/api/cruises/5/derived-variables')
        return json(200, [
          { id: 'd1', name: 'spice_anom', formula: 'spiciness0 - 1', unit: 'kg/m³', description: null },
        ]);
      if (url.pathname === '/api/cruises/5/section') {
        sectionRequests.push(url.searchParams);
        return json(200, section(url.searchParams));
      }
      if (url.pathname === '/api/cruises/5/ts') return json(200, []);
      if (url.pathname === '/api/cruises/5/geostrophy') {
        return json(200, {
          choices: { pRef: 'deepest_common', ref: 0, levels: '' },
          convention: 'Positive is northward',
          pressure: [0, 100],
          pairs: [{ a: 'MD-01', b: 'MD-02', x: 20, widthKm: 40 }],
          velocity: [[0.1], [0]],
          layers: [{ sigmaTop: 26, sigmaBottom: 26.5, transport: [0.4], total: 0.4 }],
        });
      }
      if (url.pathname === '/api/cruises/5/views' && method === 'POST') {
        viewPosts.push(JSON.parse(String(init?.body)));
        return json(201, {
          id: 'v9',
          name: 'x',
          query: '',
          shared: false,
          owner: { id: 'u1', name: 'Ana' },
          mine: true,
          createdAt: '2026-03-05T00:00:00Z',
          updatedAt: '2026-03-05T00:00:00Z',
        });
      }
      if (url.pathname === '/api/cruises/5/views') return json(200, []);
      return json(404, { error: { code: 'not_found', message: 'Not found', details: [] } });
    }),
  );
});
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

async function renderSection(search = '') {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(buildRoutes(queryClient), { initialEntries: [`/cruises/5/section${search}`] });
  render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  await screen.findByRole('group', { name: 'Section controls' }, { timeout: 8000 });
  await screen.findByRole('figure', { name: 'Section by pressure' }, { timeout: 8000 });
  const q = () => new URLSearchParams(router.state.location.search);
  return { router, q };
}

const lastSection = (coord: string) => [...sectionRequests].reverse().find((r) => r.get('coord') === coord)!;

describe('Section controls and the URL', () => {
  it('writes a changed property into the query and asks for that section', async () => {
    const { q } = await renderSection();
    expect(lastSection('pressure').get('property')).toBe('CT');
    fireEvent.change(screen.getByLabelText('Property'), { target: { value: 'SA' } });
    await waitFor(() => expect(q().get('property')).toBe('SA'), { timeout: 5000 });
    await waitFor(() => expect(lastSection('pressure').get('property')).toBe('SA'), { timeout: 5000 });
    expect(lastSection('density').get('property')).toBe('SA');
    // A derived variable is offered beside the cast columns.
    fireEvent.change(screen.getByLabelText('Property'), { target: { value: 'spice_anom' } });
    await waitFor(() => expect(q().get('property')).toBe('spice_anom'));
  });

  it('takes the reference pressure and levels from a layer set, drops the set with another reference, and back restores it', async () => {
    const { router, q } = await renderSection();
    await screen.findByRole('option', { name: /Deep water/ });
    fireEvent.change(screen.getByLabelText('Layer set'), { target: { value: 'ls1' } });
    await waitFor(() => expect(q().get('set')).toBe('ls1'));
    expect(q().get('ref')).toBe('2000');
    await waitFor(() => expect(lastSection('density').get('levels')).toBe('36.9:0.02:37.1'));
    expect(lastSection('density').get('ref')).toBe('2000');

    fireEvent.change(screen.getByLabelText('Reference pressure'), { target: { value: '0' } });
    await waitFor(() => expect(q().get('ref')).toBeNull());
    expect(q().get('set')).toBeNull();

    await act(() => router.navigate(-1));
    await waitFor(() => expect(q().get('set')).toBe('ls1'));
    expect((screen.getByLabelText('Layer set') as HTMLSelectElement).value).toBe('ls1');
    expect((screen.getByLabelText('Reference pressure') as HTMLSelectElement).value).toBe('2000');
  });

  it('sets inversion handling, interpolation and the density frame from the controls and says so in the captions', async () => {
    const { q } = await renderSection();
    fireEvent.change(screen.getByLabelText('Inversion handling'), { target: { value: 'raw' } });
    fireEvent.change(screen.getByLabelText('Interpolation'), { target: { value: 'pchip' } });
    await waitFor(() => expect(q().get('inv')).toBe('raw'));
    expect(q().get('interp')).toBe('pchip');
    await waitFor(() => expect(lastSection('density').get('interpolation')).toBe('pchip'));
    expect(lastSection('density').get('inversions')).toBe('raw');
    const density = await screen.findByRole('figure', { name: /Section by density/ });
    await waitFor(() =>
      expect(density.textContent).toMatch(/inversions raw \(first crossing\); interpolation monotone cubic/),
    );

    fireEvent.change(screen.getByLabelText('Density frame shows'), { target: { value: 'depth' } });
    await waitFor(() => expect(q().get('dframe')).toBe('depth'));
    await waitFor(() => expect(lastSection('density').get('property')).toBe('pressure'));
  });

  it('explains the inversion handlings in a tooltip', async () => {
    await renderSection();
    fireEvent.focus(screen.getByRole('button', { name: 'What the inversion handlings do' }));
    expect(screen.getByRole('tooltip').textContent).toMatch(/Thorpe/);
  });

  it('applies a colour range only when it is a range, and returns to automatic', async () => {
    const { q } = await renderSection();
    const min = screen.getByLabelText('Colour range minimum');
    const max = screen.getByLabelText('Colour range maximum');
    fireEvent.change(min, { target: { value: '10' } });
    fireEvent.change(max, { target: { value: '5' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    expect(await screen.findByText('The minimum must be below the maximum.')).toBeTruthy();
    expect(q().get('cmin')).toBeNull();
    fireEvent.change(max, { target: { value: '15.5' } });
    fireEvent.click(screen.getByRole('button', { name: 'Apply' }));
    await waitFor(() => expect(q().get('cmax')).toBe('15.5'));
    expect(q().get('cmin')).toBe('10');
    fireEvent.click(screen.getByRole('button', { name: 'Auto' }));
    await waitFor(() => expect(q().get('cmin')).toBeNull());
  });

  it('opens a link with its state in the controls', async () => {
    await renderSection('?property=SA&ref=1000&inv=drop&cmin=34&cmax=36');
    expect((screen.getByLabelText('Property') as HTMLSelectElement).value).toBe('SA');
    expect((screen.getByLabelText('Reference pressure') as HTMLSelectElement).value).toBe('1000');
    expect((screen.getByLabelText('Inversion handling') as HTMLSelectElement).value).toBe('drop');
    expect((screen.getByLabelText('Colour range minimum') as HTMLInputElement).value).toBe('34');
    expect(lastSection('pressure').get('ref')).toBe('1000');
  });
});

describe('Section cursor, readout, warnings and saved views', () => {
  it('steps the station cursor with the arrow keys and the readout follows it', async () => {
    const { q } = await renderSection();
    const frames = screen.getByRole('application');
    fireEvent.keyDown(frames, { key: 'ArrowRight' });
    await waitFor(() => expect(q().get('stn')).toBe('c1'));
    fireEvent.keyDown(frames, { key: 'ArrowRight' });
    await waitFor(() => expect(q().get('stn')).toBe('c2'));
    const readout = screen.getByRole('region', { name: 'Readout' });
    expect(within(readout).getByText('MD-02')).toBeTruthy();
    expect(within(readout).getByText('40.0 km')).toBeTruthy();
    fireEvent.keyDown(frames, { key: 'End' });
    await waitFor(() => expect(q().get('stn')).toBe('c3'));
    fireEvent.keyDown(frames, { key: 'ArrowRight' });
    expect(q().get('stn')).toBe('c3');
    fireEvent.keyDown(frames, { key: 'ArrowLeft' });
    await waitFor(() => expect(q().get('stn')).toBe('c2'));
  });

  it('counts every press of a fast key repeat, before the router has caught up', async () => {
    const { q } = await renderSection();
    const frames = screen.getByRole('application');
    fireEvent.keyDown(frames, { key: 'ArrowRight' });
    fireEvent.keyDown(frames, { key: 'ArrowRight' });
    fireEvent.keyDown(frames, { key: 'ArrowRight' });
    await waitFor(() => expect(q().get('stn')).toBe('c3'));
    expect(within(screen.getByRole('region', { name: 'Readout' })).getByText('MD-03')).toBeTruthy();
  });

  it('reads out the value under the pointer with its units and the nearest station', async () => {
    await renderSection();
    fireEvent.click(screen.getByRole('button', { name: 'hover Section by pressure' }));
    const readout = screen.getByRole('region', { name: 'Readout' });
    expect(within(readout).getByText('MD-02')).toBeTruthy();
    expect(within(readout).getByText('41.0 km')).toBeTruthy();
    expect(within(readout).getByText('95 dbar')).toBeTruthy();
    // x 41 → column 40 km, y 95 → row 100 dbar: 11.25 °C.
    expect(within(readout).getByText('11.25 °C')).toBeTruthy();
  });

  it('counts the inversions and links each to its cast sheet', async () => {
    await renderSection();
    const list = await screen.findByRole('region', { name: /Inversions of σ0/ });
    expect(list.textContent).toMatch(/1 in 1 cast/);
    const link = within(list).getByRole('link', { name: /station MD-02: inversion 120 to 128 dbar/ });
    expect(link.getAttribute('href')).toBe('/cruises/5/casts/c2');
  });

  it('saves the current view under a name, with its query', async () => {
    const { q } = await renderSection('?property=SA&stn=c2');
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect(await screen.findByText('Name the view.')).toBeTruthy();
    expect(viewPosts).toHaveLength(0);
    fireEvent.change(screen.getByLabelText('Name of the view to save'), { target: { value: '  Salinity at MD-02 ' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(viewPosts).toHaveLength(1));
    expect(viewPosts[0]).toEqual({ name: 'Salinity at MD-02', query: q().toString() });
    expect(viewPosts[0]).toEqual({ name: 'Salinity at MD-02', query: 'property=SA&stn=c2' });
  });
});
