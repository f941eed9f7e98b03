// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { CreateCruiseForm } from '../../../src/features/cruises';
import { resetCsrfToken } from '../../../src/lib/http';
import { createQueryClient } from '../../../src/lib/queryClient';

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

const created = {
  id: 42,
  name: 'Meridian Drift 2026',
  ship: 'RV Halcyon Tern',
  startDate: '2026-03-01',
  endDate: '2026-03-28',
  portStart: null,
  portEnd: null,
  region: null,
  description: null,
  locked: false,
  role: 'chief_scientist',
  stationCount: 0,
  castCount: 0,
  createdAt: '2026-01-10T09:00:00Z',
};

let posts: unknown[] = [];
let answer: () => Response = () => json(201, created);

function setup(onCreated = vi.fn()) {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <CreateCruiseForm onCreated={onCreated} />
    </QueryClientProvider>,
  );
  return onCreated;
}

function fill(label: string, value: string) {
  fireEvent.change(screen.getByLabelText(label, { exact: false }), { target: { value } });
}

const submit = () => fireEvent.click(screen.getByRole('button', { name: 'Create cruise' }));

describe('create-cruise form', () => {
  beforeEach(() => {
    posts = [];
    answer = () => json(201, created);
    resetCsrfToken();
    vi.stubGlobal(
      'fetch',
      vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
        const url = String(input);
        if (url === '/api/auth/csrf') return json(200, { token: 't' });
        if (url === '/api/cruises' && init?.method === 'POST') {
          posts.push(JSON.parse(String(init.body)));
          return answer();
        }
        return json(200, []);
      }),
    );
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('names every missing required field and sends nothing', async () => {
    setup();
    submit();
    expect(await screen.findByText('Give the cruise a name.')).toBeTruthy();
    expect(screen.getByText('Name the ship.')).toBeTruthy();
    expect(screen.getByText('Enter the departure date.')).toBeTruthy();
    expect(screen.getByText('Enter the return date.')).toBeTruthy();
    expect(screen.getByLabelText('Cruise name').getAttribute('aria-invalid')).toBe('true');
    expect(posts).toHaveLength(0);
  });

  it('refuses a cruise that ends before it starts, on the return date field', async () => {
    setup();
    fill('Cruise name', 'Meridian Drift 2026');
    fill('Ship', 'RV Halcyon Tern');
    fill('Departure date', '2026-03-28');
    fill('Return date', '2026-03-01');
    submit();
    const message = await screen.findByText('The cruise cannot end before it starts.');
    expect(message.id).toBe(screen.getByLabelText('Return date').getAttribute('aria-describedby'));
    expect(posts).toHaveLength(0);
  });

  it('accepts a one-day cruise and sends only what was filled in, trimmed', async () => {
    const onCreated = setup();
    fill('Cruise name', '  Meridian Drift 2026 ');
    fill('Ship', 'RV Halcyon Tern');
    fill('Departure date', '2026-03-01');
    fill('Return date', '2026-03-01');
    fill('Region', 'Subtropical front');
    submit();
    await waitFor(() => expect(onCreated).toHaveBeenCalledTimes(1));
    expect(posts).toEqual([
      {
        name: 'Meridian Drift 2026',
        ship: 'RV Halcyon Tern',
        startDate: '2026-03-01',
        endDate: '2026-03-01',
        region: 'Subtropical front',
      },
    ]);
    expect(onCreated.mock.calls[0][0]).toMatchObject({ id: '42', role: 'chief_scientist' });
  });

  it("shows the server's field errors inline", async () => {
    answer = () =>
      json(400, {
        error: {
          code: 'validation',
          message: 'Invalid',
          details: [{ field: 'ship', message: 'No ship by that name is registered.' }],
        },
      });
    const onCreated = setup();
    fill('Cruise name', 'Meridian Drift 2026');
    fill('Ship', 'RV Nobody');
    fill('Departure date', '2026-03-01');
    fill('Return date', '2026-03-05');
    submit();
    expect(await screen.findByText('No ship by that name is registered.')).toBeTruthy();
    expect(screen.getByLabelText('Ship').getAttribute('aria-invalid')).toBe('true');
    expect(onCreated).not.toHaveBeenCalled();
  });
});
