import { loadSettings } from './config';
import { connectDb, migrate } from './db';

const db = connectDb(loadSettings().DATABASE_URL);
const applied = await migrate(db);
console.log(
  applied.length
    ? `[sigmaline] migrations applied: ${applied.join(', ')}`
    : '[sigmaline] database schema is up to date',
);
await db.sequelize.close();
