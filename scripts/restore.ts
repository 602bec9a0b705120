// npm run restore -- FILE: puts a backup back in place. Stop the server first.
import path from 'node:path';
import { loadConfig } from '../server/config';
import { restoreDatabase } from '../server/db/backup';

const file = process.argv[2];
if (!file) {
  console.error('Say which backup to restore: npm run restore -- path/to/backup.sqlite');
  process.exit(1);
}
const config = loadConfig();
restoreDatabase(path.resolve(file), config.databaseFile)
  .then(() => console.log(`Restored ${file} into ${config.databaseFile}. Start the server again.`))
  .catch((err) => {
    console.error(`Restore failed: ${err.message}`);
    process.exit(1);
  });
