// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { FlagForm, validateFlagForm, flaggedLevels } from '../../../src/features/castsheet';
import { resetCsrfToken } from '../../../src/lib/http';
import { createQueryClient } from '../../../src/lib/queryClient';

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

/** A cast with levels every 2 dbar from 2 to 100. */
const pressure = Array.from({ length: 50 }, (_, i) => 2 + 2 * i);
let posts: unknown[] = [];

function setup(props: Partial<Parameters<typeof FlagForm>[0]> = {}) {
  return render(
    <QueryClientProvider client={createQueryClient()}>
      <FlagForm cruiseId="c1" castId="k7" pressure={pressure} {...props} />
    </QueryClientProvider>,
  );
}

const field = (label: string) =>
  screen.getByLabelText(label === 'Reason' ? /^Reason/ : label) as HTMLInputElement | HTMLSelectElement;
const fill = (label: string, value: string) => fireEvent.change(field(label), { target: { value } });
const submit = () => fireEvent.click(screen.getByRole('button', { name: 'Set flag' }));

describe('cast sheet: the flag-range form', () => {
  beforeEach(() => {
    posts = [];
    resetCsrfToken();
    vi.stubGlobal(
      'fetch',
      vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
        const url = String(input);
        if (url === '/api/auth/csrf') return json(200, { token: 't' });
        if (url === '/api/casts/k7/flags') {
          posts.push(JSON.parse(String(init?.body)));
          return json(200, { levels: 6 });
        }
        return json(404, { error: { code: 'not_found', message: 'no' } });
      }),
    );
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('names every missing field and sends nothing', async () => {
    setup();
    submit();
    expect(await screen.findByText('Choose the variable to flag.')).toBeTruthy();
    expect(screen.getByText('Enter the top of the range, dbar.')).toBeTruthy();
    expect(screen.getByText('Enter the bottom of the range, dbar.')).toBeTruthy();
    expect(screen.getByText('Choose a flag.')).toBeTruthy();
    expect(field('From (dbar)').getAttribute('aria-invalid')).toBe('true');
    expect(posts).toHaveLength(0);
  });

  it('refuses a range upside down, one of text, and one holding no level of the cast', async () => {
    setup();
    fill('Variable', 'salinity');
    fill('Flag', '2');
    fill('From (dbar)', '60');
    fill('To (dbar)', '40');
    submit();
    expect(await screen.findByText(/The bottom of the range is deeper than/)).toBeTruthy();
    fill('From (dbar)', 'ten');
    fill('To (dbar)', '40');
    submit();
    expect(await screen.findByText('The top of the range is a number of dbar.')).toBeTruthy();
    fill('From (dbar)', '200');
    fill('To (dbar)', '300');
    submit();
    expect(await screen.findByText('No level of this cast lies between 200 and 300 dbar.')).toBeTruthy();
    expect(posts).toHaveLength(0);
  });

  it('asks why when levels are downgraded to 3, 4 or 9, not when marked good', () => {
    const base = { variable: 'temperature' as const, pFrom: '10', pTo: '20', reason: '' };
    for (const flag of ['3', '4', '9']) {
      const r = validateFlagForm({ ...base, flag }, pressure);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.errors.reason).toMatch(/Say why/);
    }
    const good = validateFlagForm({ ...base, flag: '2' }, pressure);
    expect(good).toMatchObject({ ok: true, levels: 6, edit: { variable: 'temperature', pFrom: 10, pTo: 20, flag: 2 } });
  });

  it('counts the levels in the typed range live, and sends a valid edit with its reason', async () => {
    setup();
    fill('Variable', 'conductivity');
    fill('Flag', '4');
    fill('From (dbar)', '10');
    fill('To (dbar)', '20');
    expect(screen.getByText('levels in the range').textContent).toBeTruthy();
    expect(screen.getByText('6')).toBeTruthy();
    fill('Reason', 'cell fouled by a jellyfish');
    submit();
    await waitFor(() => expect(posts).toHaveLength(1));
    expect(posts[0]).toEqual({
      variable: 'conductivity',
      pFrom: 10,
      pTo: 20,
      flag: 4,
      reason: 'cell fouled by a jellyfish',
    });
    expect(await screen.findByText(/Flag 4 set on 6 levels of conductivity, 10–20 dbar/)).toBeTruthy();
  });

  it('takes a range picked on the plot into the two pressure fields', () => {
    const { rerender } = setup();
    rerender(
      <QueryClientProvider client={createQueryClient()}>
        <FlagForm cruiseId="c1" castId="k7" pressure={pressure} picked={{ pFrom: 34.5, pTo: 51.2, at: 1 }} />
      </QueryClientProvider>,
    );
    expect(field('From (dbar)').value).toBe('34.5');
    expect(field('To (dbar)').value).toBe('51.2');
  });

  it('draws questionable and bad levels from the flags that bear on each variable', () => {
    const flags = { temperature: [2, 3, 2, 4, 2], salinity: [2, 2, 3, 2, 2], conductivity: [2, 4, 2, 2, 2] };
    expect(flaggedLevels(flags, 'CT')).toEqual({ questionable: [1], bad: [3] });
    expect(flaggedLevels(flags, 'SA')).toEqual({ questionable: [2], bad: [1] });
    // σ depends on both: level 1 is bad (conductivity 4 beats temperature 3).
    expect(flaggedLevels(flags, 'sigma')).toEqual({ questionable: [2], bad: [1, 3] });
  });
});
