// npm run backup [-- FILE]: a consistent copy of the live database, safe while the server runs.
import path from 'node:path';
import { loadConfig } from '../server/config';
import { backupDatabase } from '../server/db/backup';

const config = loadConfig();
const stamp = new Date().toISOString().replace(/[:.]/g, '-');
const target = path.resolve(
  process.argv[2] ?? path.join(config.dataDir, 'backups', `loomwright-${stamp}.sqlite`),
);

backupDatabase(config.databaseFile, target)
  .then(() => console.log(`Backup written to ${target}`))
  .catch((err) => {
    console.error(`Backup failed: ${err.message}`);
    process.exit(1);
  });
