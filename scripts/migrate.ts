// Applies every pending migration to the configured database.
import { migrateToLatest } from '../src/lib/server/db/migrate';
import { closeDb } from '../src/lib/server/db';

try {
	const applied = await migrateToLatest();
	console.log(applied.length ? `[migrate] applied ${applied.join(', ')}` : '[migrate] schema is up to date');
} finally {
	await closeDb();
}
