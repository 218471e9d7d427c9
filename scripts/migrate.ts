import { runMigrations } from '../db/migrate';
import { databaseUrl } from '../db/url';

runMigrations(databaseUrl())
  .then(() => console.log('[db] migrations applied'))
  .catch((error: unknown) => {
    console.error('[db] migration failed:', error);
    process.exit(1);
  });
