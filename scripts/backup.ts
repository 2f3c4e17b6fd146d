// npm run backup [-- --to DIR]: the database and every photo object into DIR/<date>/ (default backups/).
import { parseArgs } from 'node:util';
import { config } from '../src/lib/server/config';
import { closeDb } from '../src/lib/server/db';
import { takeBackup } from '../src/lib/server/maintenance/backup';

const { values } = parseArgs({ options: { to: { type: 'string', default: 'backups' } } });
try {
	const { folder, manifest } = await takeBackup(values.to!, { db: config.db, s3: config.s3 });
	const rows = Object.values(manifest.tables).reduce((a, b) => a + b, 0);
	console.log(`backup written to ${folder}: ${Object.keys(manifest.tables).length} tables, ${rows} rows, ${manifest.photos.length} photo objects`);
} catch (err) {
	console.error(`backup failed: ${err instanceof Error ? err.message : err}`);
	process.exitCode = 1;
} finally {
	await closeDb();
}
