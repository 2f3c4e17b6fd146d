// npm run restore -- DIR: loads a backup folder into an empty database and bucket (see README, "Backups").
import { parseArgs } from 'node:util';
import { config } from '../src/lib/server/config';
import { closeDb } from '../src/lib/server/db';
import { restoreBackup } from '../src/lib/server/maintenance/backup';

const { positionals } = parseArgs({ allowPositionals: true });
if (positionals.length !== 1) {
	console.error('usage: npm run restore -- backups/<date>   (into an empty database: set DB_NAME to a new one)');
	process.exit(2);
}
try {
	const { tables, photos } = await restoreBackup(positionals[0], { db: config.db, s3: config.s3 });
	const rows = Object.values(tables).reduce((a, b) => a + b, 0);
	console.log(`restored ${rows} rows in ${Object.keys(tables).length} tables and ${photos} photo objects into ${config.db.name}`);
} catch (err) {
	console.error(`restore failed: ${err instanceof Error ? err.message : err}`);
	process.exitCode = 1;
} finally {
	await closeDb();
}
