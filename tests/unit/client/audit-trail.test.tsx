// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { AuditTrail } from '../../../src/features/cruises';
import { createQueryClient } from '../../../src/lib/queryClient';

const entry = (i: number, action: string, before: unknown, after: unknown, sentence: string) => ({
  id: String(i),
  at: `2026-03-0${1 + (i % 9)}T10:0${i % 10}:00.000Z`,
  actor: { id: 'u1', name: 'Juno Abernethy' },
  action,
  entity: 'cast',
  entityId: 'c1',
  before,
  after,
  sentence,
});

describe('audit trail panel', () => {
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });
  it('lists who did what as the server’s sentences, in its order, and opens the rest on request', async () => {
    const rows = [
      entry(
        1,
        'set_flag',
        { flagsInRange: { salinity: [2] } },
        { flag: 4, levels: 1 },
        'Juno Abernethy set flag 4 on 1 level of CP-03.',
      ),
      ...Array.from({ length: 14 }, (_, i) =>
        entry(i + 2, 'upload', null, { filename: `f${i}.csv` }, `Juno Abernethy uploaded f${i}.csv.`),
      ),
    ];
    vi.stubGlobal(
      'fetch',
      vi.fn(async (input: RequestInfo | URL) => {
        if (String(input) === '/api/cruises/c1/audit')
          return new Response(JSON.stringify(rows), { status: 200, headers: { 'content-type': 'application/json' } });
        return new Response('{}', { status: 404 });
      }),
    );
    render(
      <QueryClientProvider client={createQueryClient()}>
        <AuditTrail cruiseId="c1" />
      </QueryClientProvider>,
    );
    const table = await screen.findByRole('table', { name: 'Audit trail' });
    const body = within(table).getAllByRole('row').slice(1);
    expect(body).toHaveLength(12);
    expect(body[0].textContent).toContain('Juno Abernethy');
    expect(body[0].textContent).toContain('Juno Abernethy set flag 4 on 1 level of CP-03.');
    expect(body[1].textContent).toContain('Juno Abernethy uploaded f0.csv.');
    // sentences, not the recorded JSON
    expect(body.some((r) => /[{}"]/.test(r.textContent ?? ''))).toBe(false);
    fireEvent.click(screen.getByRole('button', { name: 'Show all 15 entries' }));
    expect(within(table).getAllByRole('row').slice(1)).toHaveLength(15);
  });
});
