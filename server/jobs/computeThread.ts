// Worker-thread body of the compute pool: one ingest computation at a time (parse an upload, or
// derive some of its casts), posted back with its column buffers transferred, not copied.
import { parentPort } from 'node:worker_threads';
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
