// The background worker: a separate process (npm run worker) or, for the single-process demo,
// started inside the web process. Any number of them can run against one database.
import { QUEUES } from '../services/queue';
import { logger } from '../lib/logger';
import type { AppDeps } from '../lib/deps';
import { runIngestJob } from './ingest';
import { buildDelivery } from '../services/deliveryBuild';

export async function startWorkers(deps: AppDeps, opts: { concurrency?: number } = {}) {
  const n = opts.concurrency ?? Number(process.env.WORKER_CONCURRENCY ?? 2);
  for (let i = 0; i < n; i++) {
    await deps.queue.boss.work<{ uploadId: string; reprocess?: boolean }>(QUEUES.ingest, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
      await runIngestJob(deps, job.data.uploadId, { reprocess: job.data.reprocess === true });
    });
  }
  await deps.queue.boss.work<{ deliveryId: string }>(QUEUES.delivery, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
    await buildDelivery(deps, job.data.deliveryId);
  });
  logger.info({ concurrency: n }, 'ingest and delivery workers started');
}

const isMain = process.argv[1] && /jobs[\\/]worker\.ts$/.test(process.argv[1]);
if (isMain) {
  const { connectServices } = await import('../services/index');
  const deps = await connectServices();
  await startWorkers(deps);
  const stop = () => { deps.close().finally(() => process.exit(0)); };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}
