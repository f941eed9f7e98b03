import { loadSettings, type Settings } from '../config';
import { connectDb, migrate } from '../db';
import { createStorage } from './storage';
import { createMailer } from './mailer';
import { createQueue } from './queue';
import type { AppDeps } from '../lib/deps';

/** Connects to PostgreSQL, object storage, SMTP and the job queue from the settings. */
export async function connectServices(
  settings: Settings = loadSettings(),
  opts: { migrate?: boolean; poolMax?: number } = {},
): Promise<AppDeps & { close(): Promise<void> }> {
  const db = connectDb(settings.DATABASE_URL, { poolMax: opts.poolMax ?? settings.DB_POOL_MAX });
  if (opts.migrate !== false) await migrate(db);
  const storage = createStorage({
    endpoint: settings.S3_ENDPOINT,
    bucket: settings.S3_BUCKET,
    region: settings.S3_REGION,
    accessKeyId: settings.S3_ACCESS_KEY_ID,
    secretAccessKey: settings.S3_SECRET_ACCESS_KEY,
  });
  await storage.ensureBucket().catch(() => undefined);
  const mailer = createMailer({
    smtpUrl: settings.SMTP_URL,
    from: settings.MAIL_FROM,
    captureUrl: settings.MAIL_CAPTURE_URL,
  });
  const queue = await createQueue(settings.DATABASE_URL, {
    expireInSeconds: Number(process.env.JOB_EXPIRE_SECONDS ?? 300),
    maintenanceIntervalSeconds: Number(process.env.QUEUE_MAINTENANCE_SECONDS ?? 30),
  });
  return {
    db,
    storage,
    mailer,
    queue,
    settings,
    async close() {
      await queue.stop().catch(() => undefined);
      await db.sequelize.close().catch(() => undefined);
    },
  };
}
