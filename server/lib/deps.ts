import type { Db } from '../db';
import type { Storage } from '../services/storage';
import type { Mailer } from '../services/mailer';
import type { Queue } from '../services/queue';
import type { Settings } from '../config';

/** What the app is built from; tests pass the real local services. */
export type AppDeps = { db: Db; storage: Storage; mailer: Mailer; queue: Queue; settings: Settings };
