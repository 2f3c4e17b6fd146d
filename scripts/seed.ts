// Loads the sample shop from content-seed/ into an empty database (npm start runs it with --if-empty).
import { readFile } from 'node:fs/promises';
import { closeDb } from '../src/lib/server/db';
import { User } from '../src/lib/server/db/models';
import { seedSampleShop } from '../src/lib/server/services/seed';

const ifEmpty = process.argv.includes('--if-empty');
try {
	if (ifEmpty && (await User.count()) > 0) {
		console.log('[seed] database already has data; leaving it as it is');
	} else {
		const read = async (name: string) => JSON.parse(await readFile(new URL(`../content-seed/${name}`, import.meta.url), 'utf8'));
		const counts = await seedSampleShop({
			shop: await read('shop.json'),
			users: await read('users.json'),
			vehicles: await read('vehicles.json'),
			parts: await read('parts.json').catch(() => [])
		});
		console.log(`[seed] sample data loaded: ${counts.users} users, ${counts.vehicles} vehicles, ${counts.revisions} revisions`);
	}
} finally {
	await closeDb();
}
