import { CONTENT_SCHEMA_VERSION } from '../../domain/content/schema';
import type { Role } from '../../domain/roles';
import { User } from '../db/models';
import { toSessionUser, createUser } from './users';
import { createVehicle } from './revisions';
import { saveSetting } from './settings';
import { createPart, samplePartInput } from './parts';

export type SampleShop = {
	shop: { name: string };
	users: { email: string; name: string; role: Role; password: string }[];
	vehicles: Record<string, unknown>[];
	parts?: unknown[];
};

/** Sample data for a new install: marks the shop as sample data so every page says so. */
export async function seedSampleShop(sample: SampleShop) {
	for (const u of sample.users) {
		if (!(await User.findOne({ where: { email: u.email } }))) await createUser(u, null);
	}
	const writer = await User.findOne({ where: { role: 'editor' } });
	const author = writer ?? (await User.findOne({ where: { role: 'admin' } }));
	if (!author) throw new Error('The sample needs at least one editor or admin user.');
	for (const v of sample.vehicles) {
		const content = 'schemaVersion' in v ? v : { schemaVersion: CONTENT_SCHEMA_VERSION, ...v };
		await createVehicle(content, toSessionUser(author), 'Sample page');
	}
	const parts = sample.parts ?? [];
	const lead = parts.length ? await User.findOne({ where: { role: ['admin', 'moderator'] } }) : null;
	if (parts.length && !lead) throw new Error('The sample parts need an admin or moderator user to enter them.');
	for (const p of parts) await createPart(samplePartInput(p as Record<string, unknown>), toSessionUser(lead!));
	await saveSetting('shopName', sample.shop.name);
	await saveSetting('sampleData', true);
	return { users: sample.users.length, vehicles: sample.vehicles.length };
}
