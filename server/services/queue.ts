// Background jobs on pg-boss, in the same PostgreSQL database as the app. A sent job also wakes
// the workers at once (NOTIFY on JOB_CHANNEL; every worker LISTENs), so no job waits for a poll;
// pg-boss's own polling stays as the fallback when a notification is lost.
import PgBoss from 'pg-boss';
import pg from 'pg';

export const QUEUES = { ingest: 'ingest-upload', delivery: 'build-delivery' } as const;
export const JOB_CHANNEL = 'sigmaline_jobs';

export type Queue = {
  boss: PgBoss;
  send(name: string, data: object, opts?: PgBoss.SendOptions): Promise<string | null>;
  /** Calls `onJob(queue name)` whenever a job is sent (by any process); returns a stop function. */
  listen(onJob: (name: string) => void): Promise<() => Promise<void>>;
  check(): Promise<void>;
  stop(): Promise<void>;
};

export async function createQueue(
  databaseUrl: string,
  opts: { max?: number; expireInSeconds?: number; maintenanceIntervalSeconds?: number } = {},
): Promise<Queue> {
  // A job whose worker died stays `active` until it expires; maintenance then hands it to another
  // worker (retry). Both intervals are settings so the fault tests need not wait minutes.
  const boss = new PgBoss({
    connectionString: databaseUrl,
    max: opts.max ?? 4,
    schema: 'pgboss',
    maintenanceIntervalSeconds: opts.maintenanceIntervalSeconds ?? 60,
  });
  boss.on('error', () => {
    /* reported through health and job state; pg-boss reconnects by itself */
  });
  await boss.start();
  for (const name of Object.values(QUEUES)) {
    const policy = {
      name,
      retryLimit: 3,
      retryDelay: 2,
      retryBackoff: false,
      expireInSeconds: opts.expireInSeconds ?? 300,
    };
    await boss.createQueue(name, policy);
    // createQueue does nothing when the queue exists, so apply the settings to an existing queue too
    // (otherwise a changed JOB_EXPIRE_SECONDS would never take effect after the first start).
    await boss.updateQueue(name, policy);
  }
  const listeners = new Set<() => Promise<void>>();
  return {
    boss,
    async send(name, data, o) {
      const id = await boss.send(name, data, o ?? {});
      if (id)
        await boss
          .getDb()
          .executeSql('SELECT pg_notify($1, $2)', [JOB_CHANNEL, name])
          .catch(() => undefined);
      return id;
    },
    async listen(onJob) {
      let stopped = false;
      let client: pg.Client | null = null;
      const connect = async (): Promise<void> => {
        if (stopped) return;
        const c = new pg.Client({ connectionString: databaseUrl });
        c.on('notification', (n) => {
          if (n.channel === JOB_CHANNEL) onJob(n.payload ?? '');
        });
        // a lost connection only slows the workers down to polling; reconnect in the background
        c.on('error', () => {
          c.end().catch(() => undefined);
          if (client === c) {
            client = null;
            setTimeout(() => {
              connect().catch(() => undefined);
            }, 1000).unref();
          }
        });
        try {
          await c.connect();
          await c.query(`LISTEN ${JOB_CHANNEL}`);
          client = c;
        } catch {
          c.end().catch(() => undefined);
          if (!stopped)
            setTimeout(() => {
              connect().catch(() => undefined);
            }, 1000).unref();
        }
      };
      await connect();
      const stop = async () => {
        stopped = true;
        listeners.delete(stop);
        await client?.end().catch(() => undefined);
        client = null;
      };
      listeners.add(stop);
      return stop;
    },
    async check() {
      await boss.getQueue(QUEUES.ingest);
    },
    async stop() {
      await Promise.all([...listeners].map((s) => s()));
      await boss.stop({ graceful: true, timeout: 5000 });
    },
  };
}
