// Worker-thread body of the compute pool: one ingest computation at a time (parse an upload, or
// derive some of its casts), posted back with its column buffers transferred, not copied.
import { parentPort } from 'node:worker_threads';
import { readlinkSync } from 'node:fs';
import { setPriority } from 'node:os';
import {
  deriveForIngest,
  derivedTransferables,
  parseForIngest,
  parsedTransferables,
  type DeriveRequest,
  type ParseRequest,
} from './ingestCompute';

type Task = { id: number; op: 'parse'; req: ParseRequest } | { id: number; op: 'derive'; req: DeriveRequest };

if (!parentPort) throw new Error('computeThread.ts runs as a worker thread');
// This thread yields the CPU to the process's event loop: on Linux a thread has its own nice value
// (setpriority on the thread id), so on a busy machine the thread that answers requests (health, the
// screens) runs first and the ingest takes what is left. Elsewhere the thread keeps the default.
try {
  const tid = Number(readlinkSync('/proc/thread-self').split('/').pop());
  if (tid > 0 && tid !== process.pid) setPriority(tid, 10);
} catch {
  // not Linux, or not allowed: the default priority
}
const port = parentPort;
const fail = (id: number, err: unknown) =>
  port.postMessage({ id, type: 'error', message: err instanceof Error ? err.message : String(err) });
port.on('message', (task: Task) => {
  if (task.op === 'parse') {
    parseForIngest(task.req)
      .then((result) =>
        port.postMessage(
          { id: task.id, type: 'done', result },
          result.kind === 'parsed' ? parsedTransferables(result.casts) : [],
        ),
      )
      .catch((err: unknown) => fail(task.id, err));
    return;
  }
  try {
    const result = deriveForIngest(task.req);
    port.postMessage({ id: task.id, type: 'done', result }, derivedTransferables(result.processed));
  } catch (err) {
    fail(task.id, err);
  }
});
port.postMessage({ type: 'ready' });
