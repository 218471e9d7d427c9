import { runMigrations } from '../db/migrate';
import { appRoleName, ownerDatabaseUrl } from '../db/url';

// As the owner of the tables; the app's own role (DATABASE_URL) is granted what it needs.
runMigrations(ownerDatabaseUrl(), { appRole: appRoleName() })
  .then(() => console.log('[db] migrations applied'))
  .catch((error: unknown) => {
    console.error('[db] migration failed:', error);
    process.exit(1);
  });
