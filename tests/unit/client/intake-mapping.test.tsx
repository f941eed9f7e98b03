// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { MemoryRouter } from 'react-router-dom';
import { UploadFollow } from '../../../src/features/intake';
import { resetCsrfToken } from '../../../src/lib/http';
import { createQueryClient } from '../../../src/lib/queryClient';

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

const failed = {
  id: 'u-9',
  filename: 'odd-headers.csv',
  status: 'failed',
  progress: 1,
  size: 1200,
  sha256: 'cd',
  errors: [
    {
      file: 'odd-headers.csv',
      line: 1,
      column: 2,
      message: 'Header “TMP_A” is not a column Sigmaline knows.',
      code: 'unmapped_header',
    },
  ],
  warnings: [],
  castIds: [],
  unmappedHeaders: ['TMP_A', 'SAL_X', 'FLUOR'],
};

let calls: { url: string; method: string; body: unknown }[] = [];
let remembered: Record<string, string> = {};
let retried = false;

function setup(canUpload = true) {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <MemoryRouter>
        <UploadFollow cruiseId="c1" upload={failed as never} canUpload={canUpload} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

describe('intake: the column-mapping step', () => {
  beforeEach(() => {
    calls = [];
    remembered = { FLUOR: 'extra' };
    retried = false;
    resetCsrfToken();
    vi.stubGlobal(
      'fetch',
      vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
        const url = String(input);
        const method = init?.method ?? 'GET';
        if (url === '/api/auth/csrf') return json(200, { token: 't' });
        calls.push({ url, method, body: init?.body ? JSON.parse(String(init.body)) : undefined });
        if (url === '/api/cruises/c1/column-mapping' && method === 'GET') return json(200, remembered);
        if (url === '/api/cruises/c1/column-mapping' && method === 'PUT')
          return json(200, (JSON.parse(String(init!.body)) as { mapping: unknown }).mapping);
        if (url === '/api/uploads/u-9/retry')
          return ((retried = true), json(202, { ...failed, status: 'queued', errors: [], progress: 0 }));
        if (url === '/api/uploads/u-9')
          return json(200, retried ? { ...failed, status: 'processing', errors: [], progress: 0.3 } : failed);
        return json(404, { error: { code: 'not_found', message: 'no' } });
      }),
    );
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
  });

  it('asks for a role per unrecognised header, prefilled from the cruise mapping', async () => {
    setup();
    expect(screen.getByRole('form', { name: 'Column mapping for odd-headers.csv' })).toBeTruthy();
    const fluor = screen.getByLabelText('Role of column FLUOR') as HTMLSelectElement;
    await waitFor(() => expect(fluor.value).toBe('extra'));
    expect((screen.getByLabelText('Role of column TMP_A') as HTMLSelectElement).value).toBe('');
    // A file that needs mapping is fixed by the mapping, not by a bare retry.
    expect(screen.queryByRole('button', { name: 'Retry odd-headers.csv' })).toBeNull();
  });

  it('refuses to save until every header has a role, and names the ones left', async () => {
    setup();
    await waitFor(() =>
      expect((screen.getByLabelText('Role of column FLUOR') as HTMLSelectElement).value).toBe('extra'),
    );
    fireEvent.change(screen.getByLabelText('Role of column TMP_A'), { target: { value: 'temperature' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save mapping and process again' }));
    const alert = await screen.findByText(/Choose a role for every column/);
    expect(alert.textContent).toContain('SAL_X');
    expect(alert.textContent).not.toContain('TMP_A');
    expect(screen.getByLabelText('Role of column SAL_X').getAttribute('aria-invalid')).toBe('true');
    expect(calls.filter((c) => c.method !== 'GET')).toHaveLength(0);
  });

  it('saves the whole mapping for the cruise, then retries the file, which starts processing again', async () => {
    setup();
    await waitFor(() =>
      expect((screen.getByLabelText('Role of column FLUOR') as HTMLSelectElement).value).toBe('extra'),
    );
    fireEvent.change(screen.getByLabelText('Role of column TMP_A'), { target: { value: 'temperature' } });
    fireEvent.change(screen.getByLabelText('Role of column SAL_X'), { target: { value: 'salinity' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save mapping and process again' }));
    await waitFor(() => expect(calls.some((c) => c.url === '/api/uploads/u-9/retry')).toBe(true));
    const writes = calls.filter((c) => c.method !== 'GET');
    expect(writes[0]).toEqual({
      url: '/api/cruises/c1/column-mapping',
      method: 'PUT',
      body: { mapping: { TMP_A: 'temperature', SAL_X: 'salinity', FLUOR: 'extra' } },
    });
    expect(writes[1]).toMatchObject({ url: '/api/uploads/u-9/retry', method: 'POST' });
    expect(await screen.findByText(/Queued|Processing/)).toBeTruthy();
    expect(screen.queryByRole('form', { name: 'Column mapping for odd-headers.csv' })).toBeNull();
  });

  it('shows the errors but no mapping controls to someone who may not upload', () => {
    setup(false);
    expect(screen.getByText('odd-headers.csv, line 1, column 2')).toBeTruthy();
    expect(screen.queryByLabelText('Role of column TMP_A')).toBeNull();
  });
});
