// Worker-thread body of the compute pool: one ingest computation at a time, posted back with its
// column buffers transferred (not copied).
import { parentPort } from 'node:worker_threads';
import { computeUpload, transferablesOf, type ComputeRequest } from './ingestCompute';

type Task = { id: number; req: ComputeRequest };

if (!parentPort) throw new Error('computeThread.ts runs as a worker thread');
const port = parentPort;
port.on('message', (task: Task) => {
  computeUpload(task.req, () => port.postMessage({ id: task.id, type: 'parsed' }))
    .then((result) => port.postMessage({ id: task.id, type: 'done', result }, transferablesOf(result)))
    .catch((err: unknown) => port.postMessage({ id: task.id, type: 'error', message: err instanceof Error ? err.message : String(err) }));
});
port.postMessage({ type: 'ready' });
