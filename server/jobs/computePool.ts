// A small pool of worker threads for the CPU-bound half of an ingest (parse, inflate, derive), so
// the event loop of the process that runs the job (the worker process, or the web process when
// start.sh runs the worker in process) keeps answering while casts are computed. A thread that
// dies fails its task (the job is retried) and is replaced.
import { Worker } from 'node:worker_threads';
import { availableParallelism } from 'node:os';
import { logger } from '../lib/logger';
import {
  parsedTransferables,
  type DeriveOutcome,
  type DeriveRequest,
  type ParseOutcome,
  type ParseRequest,
} from './ingestCompute';

type Pending = {
  id: number;
  op: 'parse' | 'derive';
  req: ParseRequest | DeriveRequest;
  transfer: ArrayBuffer[];
  resolve: (r: never) => void;
  reject: (e: Error) => void;
};
type Slot = { worker: Worker; ready: Promise<void>; task: Pending | null };

export class ComputePool {
  private slots: Slot[] = [];
  private queue: Pending[] = [];
  private nextId = 1;
  private closed = false;

  constructor(readonly size: number) {
    for (let i = 0; i < size; i++) this.slots.push(this.spawn());
  }

  /** Resolves when every thread has loaded its code (the first task then starts at once). */
  async warm(): Promise<void> {
    await Promise.all(this.slots.map((s) => s.ready));
  }

  /** Parse (and inflate) an upload in a thread. */
  parse(req: ParseRequest): Promise<ParseOutcome> {
    return this.submit('parse', req, []);
  }

  /** Derive some casts in a thread; their column buffers move to it (the caller must not reuse them). */
  derive(req: DeriveRequest): Promise<DeriveOutcome> {
    return this.submit('derive', req, parsedTransferables(req.casts));
  }

  private submit<T>(op: 'parse' | 'derive', req: ParseRequest | DeriveRequest, transfer: ArrayBuffer[]): Promise<T> {
    if (this.closed) return Promise.reject(new Error('compute pool closed'));
    return new Promise<T>((resolve, reject) => {
      this.queue.push({ id: this.nextId++, op, req, transfer, resolve: resolve as (r: never) => void, reject });
      this.pump();
    });
  }

  async close(): Promise<void> {
    this.closed = true;
    for (const p of this.queue.splice(0)) p.reject(new Error('compute pool closed'));
    await Promise.all(this.slots.map((s) => s.worker.terminate()));
  }

  private spawn(): Slot {
    const worker = new Worker(new URL('./computeThread.mjs', import.meta.url), { execArgv: [] });
    worker.unref();
    let markReady!: () => void;
    const slot: Slot = {
      worker,
      ready: new Promise<void>((r) => {
        markReady = r;
      }),
      task: null,
    };
    worker.on('message', (m: { type: 'ready' | 'done' | 'error'; id?: number; result?: never; message?: string }) => {
      if (m.type === 'ready') {
        markReady();
        return;
      }
      const t = slot.task;
      if (!t || t.id !== m.id) return;
      slot.task = null;
      if (m.type === 'done') t.resolve(m.result!);
      else t.reject(new Error(`ingest computation failed: ${m.message}`));
      this.pump();
    });
    worker.on('error', (err) => logger.error({ err }, 'compute thread error'));
    worker.on('exit', (code) => {
      const t = slot.task;
      slot.task = null;
      markReady();
      if (t) t.reject(new Error(`compute thread exited (code ${code}) during an ingest`));
      if (this.closed) return;
      const i = this.slots.indexOf(slot);
      if (i >= 0) this.slots[i] = this.spawn();
      this.pump();
    });
    return slot;
  }

  private pump(): void {
    for (const slot of this.slots) {
      if (slot.task || !this.queue.length) continue;
      const t = this.queue.shift()!;
      slot.task = t;
      // the upload's bytes are copied (the caller's buffer may be a slice of a pooled one); parsed
      // columns are moved
      slot.worker.postMessage({ id: t.id, op: t.op, req: t.req }, t.transfer);
    }
  }
}

let shared: ComputePool | null = null;

/** The process's pool, started on first use: INGEST_THREADS threads (default: the cores, 1–4). */
export function computePool(): ComputePool {
  shared ??= new ComputePool(Math.max(1, Number(process.env.INGEST_THREADS) || Math.min(4, availableParallelism())));
  return shared;
}

export async function closeComputePool(): Promise<void> {
  const p = shared;
  shared = null;
  await p?.close();
}
