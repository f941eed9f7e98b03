// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';

// The preview plot needs Plotly, which jsdom cannot draw; the test is about the form around it.
vi.mock('../../../src/components/plot/LazyPlot', () => ({
  LazyPlot: ({ label }: { label: string }) => <figure aria-label={label} />,
}));

import { DerivedForm } from '../../../src/features/derived';
import { resetCsrfToken } from '../../../src/lib/http';
import { createQueryClient } from '../../../src/lib/queryClient';

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

const casts = [
  {
    id: 'k1',
    station: 'K-01',
    cast: '1',
    latitude: 0,
    longitude: 0,
    time: null,
    bottomDepth: 4000,
    levels: 3,
    inversions: 0,
  },
];
const cast = {
  id: 'k1',
  station: 'K-01',
  cast: '1',
  latitude: 10,
  longitude: -30,
  time: null,
  bottomDepth: 4000,
  levels: 3,
  uploadId: null,
  sourceFile: 'k01.csv',
  inversions: [],
  metadata: {},
  notes: [],
  fitness: {},
  units: {},
  extras: { fluor: { unit: 'mg/m³', values: [0.1, 0.2, 0.1] } },
  flags: {},
  columns: {
    pressure: [2, 4, 6],
    CT: [20, 19, 18],
    SA: [35, 35.1, 35.2],
    sigma0: [24, 24.2, 24.4],
    sigma2: [32, 32.2, 32.4],
  },
};

let previews: string[] = [];
let posts: unknown[] = [];
let createAnswer: () => Response;

function previewAnswer(formula: string): Response {
  // The server's parser reports where it stopped, 0-based.
  const bad = formula.indexOf('**');
  if (bad >= 0)
    return json(400, {
      error: {
        code: 'formula',
        message: 'Unexpected operator *',
        details: [{ field: 'formula', message: 'Unexpected operator *', position: bad + 1 }],
      },
    });
  if (formula.includes('sigma9'))
    return json(400, {
      error: {
        code: 'formula',
        message: 'Unknown column sigma9',
        details: [{ field: 'formula', message: 'Unknown column “sigma9”', position: formula.indexOf('sigma9') }],
      },
    });
  return json(200, {
    pressure: [2, 4, 6],
    values: [8, 8, 8],
    variables: ['CT', 'SA', 'fluor', 'pressure', 'sigma0', 'sigma2'],
  });
}

function setup() {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <DerivedForm cruiseId="c1" casts={casts} taken={['old_var']} previewDelayMs={0} />
    </QueryClientProvider>,
  );
}

const formula = () => screen.getByLabelText('Formula') as HTMLTextAreaElement;
const typeFormula = (v: string) => fireEvent.change(formula(), { target: { value: v } });
const save = () => fireEvent.click(screen.getByRole('button', { name: 'Add derived variable' }));

describe('derived variables: formula errors and preview', () => {
  beforeEach(() => {
    previews = [];
    posts = [];
    createAnswer = () => json(201, { id: 'd1', name: 'x', formula: 'y', unit: null, description: null });
    resetCsrfToken();
    vi.stubGlobal(
      'fetch',
      vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
        const url = String(input);
        if (url === '/api/auth/csrf') return json(200, { token: 't' });
        if (url === '/api/casts/k1') return json(200, cast);
        if (url === '/api/casts/k1/formula-preview') {
          const f = (JSON.parse(String(init?.body)) as { formula: string }).formula;
          previews.push(f);
          return previewAnswer(f);
        }
        if (url === '/api/cruises/c1/derived-variables' && init?.method === 'POST') {
          posts.push(JSON.parse(String(init.body)));
          return createAnswer();
        }
        return json(200, []);
      }),
    );
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('lists the columns of the chosen cast as insertable names', async () => {
    setup();
    const insert = await screen.findByRole('button', { name: 'Insert fluor' });
    expect(screen.getByRole('button', { name: 'Insert sigma2' })).toBeTruthy();
    typeFormula('CT -');
    fireEvent.click(insert);
    expect(formula().value).toBe('CT - fluor');
  });

  it('shows the parser’s error inline with a caret under its position, and marks the field', async () => {
    setup();
    typeFormula('CT ** 2');
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('Unexpected operator *');
    expect(alert.textContent).toContain('at character 5');
    const caret = screen.getByTestId('formula-caret').textContent ?? '';
    const [text, marks] = caret.split('\n');
    expect(text).toBe('CT ** 2');
    expect(marks).toBe('    ^');
    expect(formula().getAttribute('aria-invalid')).toBe('true');
    expect(screen.queryByRole('figure')).toBeNull();
  });

  it('clears the error and draws the preview once the formula parses', async () => {
    setup();
    typeFormula('sigma9 - sigma0');
    expect((await screen.findByRole('alert')).textContent).toContain('Unknown column “sigma9”');
    typeFormula('sigma2 - sigma0');
    expect(await screen.findByRole('figure', { name: /Preview of formula on station K-01 cast 1/ })).toBeTruthy();
    expect(screen.queryByRole('alert')).toBeNull();
    expect(formula().getAttribute('aria-invalid')).toBeNull();
    expect(previews).toContain('sigma2 - sigma0');
  });

  it('checks the name before sending: an identifier, not taken by a column or another variable', async () => {
    setup();
    await screen.findByRole('button', { name: 'Insert fluor' });
    typeFormula('sigma2 - sigma0');
    fireEvent.change(screen.getByLabelText('Name'), { target: { value: '2nd-try' } });
    save();
    expect(await screen.findByText(/A name is a letter or _/)).toBeTruthy();
    fireEvent.change(screen.getByLabelText('Name'), { target: { value: 'sigma0' } });
    save();
    expect(await screen.findByText('“sigma0” is already a column or a derived variable.')).toBeTruthy();
    expect(posts).toHaveLength(0);
  });

  it('shows a save-time formula error from the server at its position', async () => {
    createAnswer = () =>
      json(400, {
        error: {
          code: 'validation',
          message: 'bad formula',
          details: [{ field: 'formula', message: 'Division by a column that is zero somewhere', position: 5 }],
        },
      });
    setup();
    await screen.findByRole('button', { name: 'Insert fluor' });
    fireEvent.change(screen.getByLabelText('Name'), { target: { value: 'ratio' } });
    typeFormula('CT / SA');
    await screen.findByRole('figure');
    save();
    await waitFor(() => expect(posts).toEqual([{ name: 'ratio', formula: 'CT / SA' }]));
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('Division by a column that is zero somewhere');
    expect((screen.getByTestId('formula-caret').textContent ?? '').split('\n')[1]).toBe('     ^');
  });
});
