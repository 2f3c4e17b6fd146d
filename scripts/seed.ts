// Loads the sample shop from content-seed/ into an empty database (npm start runs it with --if-empty).
import { readFile } from 'node:fs/promises';
import { closeDb, db } from '../src/lib/server/db';
import { User } from '../src/lib/server/db/models';
import { seedSampleShop } from '../src/lib/server/services/seed';

const ifEmpty = process.argv.includes('--if-empty');
const read = async (name: string) => JSON.parse(await readFile(new URL(`../content-seed/${name}`, import.meta.url), 'utf8'));
try {
	db();
	if (ifEmpty && (await User.count()) > 0) {
		console.log('[seed] database already has data; leaving it as it is');
	} else {
		const counts = await seedSampleShop({
			shop: (await read('shop.json')).shop,
			users: (await read('users.json')).users,
			vehicles: (await read('vehicles.json')).vehicles,
			parts: (await read('parts.json')).parts
		});
		console.log(`[seed] sample data loaded: ${counts.users} users, ${counts.vehicles} vehicles`);
	}
} finally {
	await closeDb();
}
