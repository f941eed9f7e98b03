// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { act, cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { QueryClientProvider } from '@tanstack/react-query';
import { MemoryRouter } from 'react-router-dom';
import { DropZone, OutgoingList, resetUploadToken, useSendFiles } from '../../../src/features/intake';
import { resetCsrfToken } from '../../../src/lib/http';
import { createQueryClient } from '../../../src/lib/queryClient';

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

/** A stand-in XMLHttpRequest the test drives by hand: progress events, then the answer. */
class FakeXHR {
  static all: FakeXHR[] = [];
  method = '';
  url = '';
  headers: Record<string, string> = {};
  body: FormData | null = null;
  status = 0;
  statusText = '';
  responseText = '';
  upload: { onprogress: ((e: ProgressEvent) => void) | null } = { onprogress: null };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  constructor() {
    FakeXHR.all.push(this);
  }
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(name: string, value: string) {
    this.headers[name.toLowerCase()] = value;
  }
  send(body: FormData) {
    this.body = body;
  }
  abort() {
    this.onabort?.();
  }
  progress(loaded: number, total: number) {
    this.upload.onprogress?.({ loaded, total, lengthComputable: true } as ProgressEvent);
  }
  answer(status: number, body: unknown) {
    this.status = status;
    this.responseText = JSON.stringify(body);
    this.onload?.();
  }
}

const upload = (over: Record<string, unknown> = {}) => ({
  id: 'u-1',
  filename: 'stn07.csv',
  status: 'queued',
  progress: 0,
  size: 4000,
  sha256: 'ab',
  errors: [],
  warnings: [],
  castIds: [],
  unmappedHeaders: null,
  ...over,
});

let uploadAnswers: Record<string, unknown>[] = [];

function Harness() {
  const s = useSendFiles('c1');
  return (
    <>
      <DropZone onFiles={s.send} />
      <OutgoingList cruiseId="c1" outgoing={s.outgoing} onCancel={s.cancel} onClear={s.clearFinished} />
    </>
  );
}

function setup() {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <MemoryRouter>
        <Harness />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

const file = (name: string, bytes: number) => new File([new Uint8Array(bytes)], name, { type: 'text/csv' });

function choose(...files: File[]) {
  fireEvent.change(screen.getByLabelText('Cast files to upload'), { target: { files } });
}

/** Let the CSRF fetch resolve and the XHR start. */
const flush = () =>
  act(async () => {
    for (let i = 0; i < 5; i++) await Promise.resolve();
    await new Promise((r) => setTimeout(r, 0));
  });

describe('intake: per-file upload progress', () => {
  beforeEach(() => {
    FakeXHR.all = [];
    uploadAnswers = [];
    resetCsrfToken();
    resetUploadToken();
    vi.stubGlobal('XMLHttpRequest', FakeXHR);
    vi.stubGlobal(
      'fetch',
      vi.fn(async (input: RequestInfo | URL) => {
        const url = String(input);
        if (url === '/api/auth/csrf') return json(200, { token: 'tok-1' });
        if (url.startsWith('/api/uploads/'))
          return json(200, uploadAnswers.shift() ?? upload({ status: 'processing', progress: 0.5 }));
        return json(200, []);
      }),
    );
  });
  afterEach(() => {
    cleanup();
    vi.unstubAllGlobals();
    vi.useRealTimers();
  });

  it('sends each file in its own request with the CSRF header and shows the bytes sent', async () => {
    setup();
    choose(file('stn07.csv', 4000), file('stn08.csv', 2000));
    await flush();
    expect(FakeXHR.all).toHaveLength(2);
    const [a, b] = FakeXHR.all;
    expect(a.method).toBe('POST');
    expect(a.url).toBe('/api/cruises/c1/uploads');
    expect(a.headers['x-csrf-token']).toBe('tok-1');
    expect((a.body?.get('files') as File).name).toBe('stn07.csv');
    expect((b.body?.get('files') as File).name).toBe('stn08.csv');

    const barA = screen.getByRole('progressbar', { name: 'Sending stn07.csv' });
    const barB = screen.getByRole('progressbar', { name: 'Sending stn08.csv' });
    expect(barA.getAttribute('aria-valuenow')).toBe('0');

    act(() => a.progress(1000, 4000));
    expect(barA.getAttribute('aria-valuenow')).toBe('25');
    expect(barB.getAttribute('aria-valuenow')).toBe('0');
    act(() => a.progress(3000, 4000));
    expect(barA.getAttribute('aria-valuenow')).toBe('75');
    expect(barA.getAttribute('aria-valuetext')).toContain('2.9 kB / 3.9 kB');
    act(() => b.progress(2000, 2000));
    expect(barB.getAttribute('aria-valuenow')).toBe('100');
  });

  it('after the bytes arrive, follows processing and lists errors by file, line and column', async () => {
    setup();
    choose(file('stn07.csv', 4000));
    await flush();
    uploadAnswers = [
      upload({
        status: 'failed',
        errors: [
          {
            file: 'stn07.csv',
            line: 14,
            column: 3,
            message: 'Text “n/a” where a temperature was expected.',
            code: 'not_a_number',
          },
        ],
      }),
    ];
    act(() => FakeXHR.all[0].answer(202, { uploads: [upload()] }));
    await flush();
    // Bytes done: the send bar is gone, the processing status has taken over.
    expect(screen.queryByRole('progressbar', { name: 'Sending stn07.csv' })).toBeNull();
    expect(screen.getByText('Queued')).toBeTruthy();
    const errors = await screen.findByRole('list', { name: 'Errors in stn07.csv' }, { timeout: 3000 });
    expect(within(errors).getByText('stn07.csv, line 14, column 3')).toBeTruthy();
    expect(within(errors).getByText(/Text “n\/a” where a temperature/)).toBeTruthy();
    expect(screen.getByText('Failed')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Retry stn07.csv' })).toBeTruthy();
  });

  it('a refused file (413) says why, in its own row, and the others go on', async () => {
    setup();
    choose(file('huge.zip', 9000), file('ok.csv', 100));
    await flush();
    act(() =>
      FakeXHR.all[0].answer(413, {
        error: { code: 'too_large', message: 'huge.zip is over the 50 MB limit.', details: [] },
      }),
    );
    await flush();
    expect(screen.getByRole('alert').textContent).toContain('huge.zip is over the 50 MB limit.');
    expect(screen.getByRole('progressbar', { name: 'Sending ok.csv' })).toBeTruthy();
  });

  it('sends at most two files at a time; the third waits with its own empty bar', async () => {
    setup();
    choose(file('a.csv', 10), file('b.csv', 10), file('c.csv', 10));
    await flush();
    expect(FakeXHR.all).toHaveLength(2);
    expect(screen.getByRole('progressbar', { name: 'Sending c.csv' }).getAttribute('aria-valuenow')).toBe('0');
    act(() => FakeXHR.all[0].answer(202, { uploads: [upload({ id: 'u-a', filename: 'a.csv' })] }));
    await flush();
    expect(FakeXHR.all).toHaveLength(3);
    expect((FakeXHR.all[2].body?.get('files') as File).name).toBe('c.csv');
  });
});
