import type { AppDeps } from '../lib/deps';
import { ingestUpload } from '../services/ingest';

/** pg-boss handler body: process one upload. Parse problems end as `failed` (final); a fault
 * (storage or database down) throws so pg-boss retries the job. */
export async function runIngestJob(
  deps: AppDeps,
  uploadId: string,
  opts: { reprocess?: boolean; queuedAt?: Date } = {},
) {
  await ingestUpload(deps, uploadId, opts);
}
