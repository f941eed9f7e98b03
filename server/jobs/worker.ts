// The background worker: a separate process (npm run worker) or, for the single-process demo,
// started inside the web process. Any number of them can run against one database.
//
// Ingest jobs are taken in batches (INGEST_BATCH, default 8, per loop; WORKER_CONCURRENCY loops)
// as soon as they are sent (the queue's NOTIFY wakes every loop), and a loop that found work looks
// again at once instead of waiting for its next poll. Parsing and deriving run in the compute
// pool's threads (server/jobs/computePool.ts), so this process's event loop stays free.
import { QUEUES } from '../services/queue';
import { logger } from '../lib/logger';
import type { AppDeps } from '../lib/deps';
import { runIngestJob } from './ingest';
import { buildDelivery } from '../services/deliveryBuild';
import { computePool, closeComputePool } from './computePool';

type IngestJob = { id: string; data: { uploadId: string; reprocess?: boolean }; createdOn?: Date };

export async function startWorkers(deps: AppDeps, opts: { concurrency?: number; batchSize?: number } = {}) {
  const n = opts.concurrency ?? Number(process.env.WORKER_CONCURRENCY ?? 2);
  const batchSize = opts.batchSize ?? Number(process.env.INGEST_BATCH ?? 8);
  const { boss } = deps.queue;
  // the threads start loading their code now; a job that comes before they are ready waits for them
  const pool = computePool();
  const ingestWorkers: string[] = [];
  const wake = () => {
    for (const id of ingestWorkers) boss.notifyWorker(id);
  };
  for (let i = 0; i < n; i++) {
    let self: string | null = null;
    self = await boss.work<{ uploadId: string; reprocess?: boolean }>(
      QUEUES.ingest,
      { batchSize, pollingIntervalSeconds: 0.5, includeMetadata: true },
      async (jobs) => {
        // this loop found work: it looks for more as soon as this batch is done
        if (self) boss.notifyWorker(self);
        const results = await Promise.allSettled(
          (jobs as unknown as IngestJob[]).map((job) =>
            runIngestJob(deps, job.data.uploadId, { reprocess: job.data.reprocess === true, queuedAt: job.createdOn }),
          ),
        );
        // a job that faulted is failed on its own (pg-boss retries it); the others complete
        await Promise.all(
          results.map((r, k) => {
            if (r.status === 'fulfilled') return null;
            logger.warn({ err: r.reason, uploadId: jobs[k].data.uploadId }, 'ingest job failed; pg-boss retries it');
            return boss.fail(QUEUES.ingest, jobs[k].id, { message: String((r.reason as Error)?.message ?? r.reason) });
          }),
        );
      },
    );
    ingestWorkers.push(self);
  }
  // Deliveries: one loop, woken by the queue's NOTIFY like the ingest loops (a build asked for on
  // the screen starts at once, not at the next poll), and looking again at once after a build.
  let deliveryWorker: string | null = null;
  deliveryWorker = await boss.work<{ deliveryId: string }>(
    QUEUES.delivery,
    { batchSize: 1, pollingIntervalSeconds: 0.5 },
    async ([job]) => {
      if (deliveryWorker) boss.notifyWorker(deliveryWorker);
      await buildDelivery(deps, job.data.deliveryId);
    },
  );
  const stopListening = await deps.queue.listen((name) => {
    if (name === QUEUES.ingest) wake();
    if (name === QUEUES.delivery && deliveryWorker) boss.notifyWorker(deliveryWorker);
  });
  logger.info({ concurrency: n, batchSize, threads: pool.size }, 'ingest and delivery workers started');
  return {
    async stop() {
      await stopListening();
      await closeComputePool();
    },
  };
}

const isMain = process.argv[1] && /jobs[\\/]worker\.ts$/.test(process.argv[1]);
if (isMain) {
  const { connectServices } = await import('../services/index');
  const deps = await connectServices();
  const workers = await startWorkers(deps);
  const stop = () => {
    workers
      .stop()
      .then(() => deps.close())
      .finally(() => process.exit(0));
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}
