// Background jobs on pg-boss, in the same PostgreSQL database as the app.
import PgBoss from 'pg-boss';

export const QUEUES = { ingest: 'ingest-upload', delivery: 'build-delivery' } as const;

export type Queue = {
  boss: PgBoss;
  send(name: string, data: object, opts?: PgBoss.SendOptions): Promise<string | null>;
  check(): Promise<void>;
  stop(): Promise<void>;
};

export async function createQueue(databaseUrl: string, opts: { max?: number; expireInSeconds?: number; maintenanceIntervalSeconds?: number } = {}): Promise<Queue> {
  // A job whose worker died stays `active` until it expires; maintenance then hands it to another
  // worker (retry). Both intervals are settings so the fault tests need not wait minutes.
  const boss = new PgBoss({ connectionString: databaseUrl, max: opts.max ?? 4, schema: 'pgboss', maintenanceIntervalSeconds: opts.maintenanceIntervalSeconds ?? 60 });
  boss.on('error', () => { /* reported through health and job state; pg-boss reconnects by itself */ });
  await boss.start();
  for (const name of Object.values(QUEUES)) {
    const policy = { name, retryLimit: 3, retryDelay: 2, retryBackoff: false, expireInSeconds: opts.expireInSeconds ?? 300 };
    await boss.createQueue(name, policy);
    // createQueue does nothing when the queue exists, so apply the settings to an existing queue too
    // (otherwise a changed JOB_EXPIRE_SECONDS would never take effect after the first start).
    await boss.updateQueue(name, policy);
  }
  return {
    boss,
    send: (name, data, o) => boss.send(name, data, o ?? {}),
    async check() {
      await boss.getQueue(QUEUES.ingest);
    },
    stop: () => boss.stop({ graceful: true, timeout: 5000 }),
  };
}
