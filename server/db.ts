import { Sequelize } from 'sequelize';
import { initModels } from './models/index';
import * as m001 from './migrations/001-initial';
import * as m002 from './migrations/002-analysis-and-deliveries';
import * as m003 from './migrations/003-cast-life';
import * as m004 from './migrations/004-lines';
import * as m005 from './migrations/005-hardening';
import * as m007 from './migrations/007-shared-views';
import * as m008 from './migrations/008-qc';
import * as m009 from './migrations/009-line-links';
import * as m011 from './migrations/011-intake-answers';
import type { QueryInterface } from 'sequelize';

export type Db = { sequelize: Sequelize };

/** Connects Sequelize to PostgreSQL and registers the models. */
export function connectDb(databaseUrl: string, opts: { poolMax?: number } = {}): Db {
  const sequelize = new Sequelize(databaseUrl, {
    dialect: 'postgres',
    logging: false,
    pool: { max: opts.poolMax ?? 20, min: 0, idle: 10_000, acquire: 30_000 },
    retry: { max: 3 },
  });
  initModels(sequelize);
  return { sequelize };
}

type Migration = { name: string; up: (qi: QueryInterface) => Promise<void> };
export const MIGRATIONS: Migration[] = [
  { name: '001-initial', up: m001.up },
  { name: '002-analysis-and-deliveries', up: m002.up },
  { name: '003-cast-life', up: m003.up },
  { name: '004-lines', up: m004.up },
  { name: '005-hardening', up: m005.up },
  { name: '007-shared-views', up: m007.up },
  { name: '008-qc', up: m008.up },
  { name: '009-line-links', up: m009.up },
  { name: '011-intake-answers', up: m011.up },
];

/** Runs forward every migration not yet applied, each in its own transaction, under an advisory lock
 * so that several processes starting at once migrate once. */
export async function migrate(db: Db): Promise<string[]> {
  const { sequelize } = db;
  const applied: string[] = [];
  await sequelize.transaction(async (t) => {
    await sequelize.query('SELECT pg_advisory_xact_lock(724311)', { transaction: t });
    await sequelize.query(
      'CREATE TABLE IF NOT EXISTS schema_migrations (name text PRIMARY KEY, applied_at timestamptz NOT NULL DEFAULT now())',
      { transaction: t },
    );
    const [rows] = await sequelize.query('SELECT name FROM schema_migrations', { transaction: t });
    const done = new Set((rows as { name: string }[]).map((r) => r.name));
    for (const mig of MIGRATIONS) {
      if (done.has(mig.name)) continue;
      const qi = sequelize.getQueryInterface();
      // QueryInterface helpers do not all take a transaction option; route every query the
      // migration makes through this transaction so a failed migration leaves nothing behind.
      const orig = sequelize.query.bind(sequelize);
      (sequelize as unknown as { query: typeof orig }).query = ((sql: string, options?: object) =>
        orig(sql, { ...(options ?? {}), transaction: t })) as typeof orig;
      try {
        await mig.up(qi);
      } finally {
        (sequelize as unknown as { query: typeof orig }).query = orig;
      }
      await sequelize.query('INSERT INTO schema_migrations(name) VALUES (:name)', {
        replacements: { name: mig.name },
        transaction: t,
      });
      applied.push(mig.name);
    }
  });
  return applied;
}
