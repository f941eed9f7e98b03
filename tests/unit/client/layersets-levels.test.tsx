// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { LayerSetForm, levelsFeedback } from '../../../src/features/layersets';
import { resetCsrfToken } from '../../../src/lib/http';
import { createQueryClient } from '../../../src/lib/queryClient';

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

let posts: unknown[] = [];
let answer: (body: unknown) => Response;

function setup() {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <LayerSetForm cruiseId="c1" />
    </QueryClientProvider>,
  );
}

const levels = () => screen.getByLabelText('Levels') as HTMLInputElement;
const feedback = () => screen.getByTestId('levels-feedback').textContent ?? '';
const type = (value: string) => fireEvent.change(levels(), { target: { value } });

describe('layer sets: the levels field', () => {
  beforeEach(() => {
    posts = [];
    answer = (body) => json(201, { id: 's1', count: 3, ...(body as object) });
    resetCsrfToken();
    vi.stubGlobal(
      'fetch',
      vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
        const url = String(input);
        if (url === '/api/auth/csrf') return json(200, { token: 't' });
        if (url === '/api/cruises/c1/layer-sets' && init?.method === 'POST') {
          const body = JSON.parse(String(init.body));
          posts.push(body);
          return answer(body);
        }
        return json(200, []);
      }),
    );
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('counts a start:step:end range live, with its first and last level and the step', () => {
    setup();
    type('26.0:0.05:27.9');
    expect(feedback()).toBe('39 levels, from 26.00 to 27.90 kg/m³ (σ₀), every 0.05');
    type('26.0:0.05:27.92');
    // The end is included only when it falls on a step.
    expect(feedback()).toMatch(/^39 levels, from 26.00 to 27.90/);
    expect(levels().getAttribute('aria-invalid')).toBeNull();
  });

  it('reads a comma list, and names what is wrong with a bad one', () => {
    setup();
    type('26.5, 26.8, 27.0');
    expect(feedback()).toMatch(/^3 levels, from 26.50 to 27.00/);
    type('26.5, 26.4');
    expect(feedback()).toBe('levels must be strictly increasing');
    expect(levels().getAttribute('aria-invalid')).toBe('true');
    type('26.5, abc');
    expect(feedback()).toBe('"abc" is not a number');
    type('27:0:28');
    expect(feedback()).toBe('step must be positive');
    type('27:0.1:26');
    expect(feedback()).toBe('end must not be below start');
  });

  it('says which σ the levels are in when the reference pressure changes', () => {
    setup();
    type('36.0:0.05:37.2');
    fireEvent.change(screen.getByLabelText('Reference pressure'), { target: { value: '2000' } });
    expect(feedback()).toContain('kg/m³ (σ₂)');
  });

  it('will not send a set whose levels do not parse', async () => {
    setup();
    fireEvent.change(screen.getByLabelText('Name'), { target: { value: 'thermocline' } });
    type('26.5, 26.4');
    fireEvent.click(screen.getByRole('button', { name: 'Add layer set' }));
    await waitFor(() => expect(feedback()).toBe('levels must be strictly increasing'));
    expect(posts).toHaveLength(0);
  });

  it('shows the server’s levels error inline under the field', async () => {
    answer = () =>
      json(400, {
        error: { code: 'validation', message: 'bad', details: [{ field: 'levels', message: 'more than 2000 levels' }] },
      });
    setup();
    fireEvent.change(screen.getByLabelText('Name'), { target: { value: 'fine' } });
    type('20:0.01:39');
    fireEvent.click(screen.getByRole('button', { name: 'Add layer set' }));
    await waitFor(() => expect(posts).toHaveLength(1));
    expect(posts[0]).toEqual({ name: 'fine', referencePressure: 0, levels: '20:0.01:39' });
    await waitFor(() => expect(feedback()).toBe('more than 2000 levels'));
  });

  it('feedback agrees with the shared parser on rounding', () => {
    expect(levelsFeedback('24.0:0.1:24.3')).toEqual({ state: 'ok', count: 4, first: 24, last: 24.3, step: 0.1 });
    expect(levelsFeedback('  ')).toEqual({ state: 'empty' });
  });
});
