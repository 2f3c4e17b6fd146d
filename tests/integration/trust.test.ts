import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { emptyContent } from '../../src/lib/domain/content/schema';
import { createVehicle, revisionById, saveRevision } from '../../src/lib/server/services/revisions';
import { requireVehicle } from '../../src/lib/server/services/vehicles';
import { flaggableFields, flagField, FLAGS_PER_PAGE_PER_DAY } from '../../src/lib/server/services/trust';
import { createUser } from '../../src/lib/server/services/users';
import { Confirmation } from '../../src/lib/server/db/models';
import type { SessionUser } from '../../src/lib/domain/sessionUser';

let writer: SessionUser;
let viewer: SessionUser;
let vehicleId: number;
let slug: string;

beforeAll(async () => {
	await freshDatabase('trust');
	writer = await makeUser('editor', 'Sample Writer');
	viewer = await makeUser('viewer', 'Sample Installer');
	const content = emptyContent({ make: 'Quillan', model: 'Flagstaff', yearFrom: 2014, yearTo: 2018, body: 'wagon' });
	content.seats.spaces.push({ id: 'drv', seat: 'driver', lengthMm: 500, widthMm: 400, heightMm: 90, obstacles: '', boardNeeded: false, travelNotes: '' });
	slug = (await createVehicle(content, writer)).slug;
	vehicleId = (await requireVehicle(slug)).id;
});
afterAll(() => closeDb());

describe('flags a person can raise', () => {
	it('takes one flag per field and revision from each person, and the same field again after the page changes', async () => {
		const flag = { fieldPath: 'seats.spaces[drv].heightMm', note: 'Only 80 mm with the seat all the way down.' };
		await flagField(vehicleId, flag, viewer);
		await expect(flagField(vehicleId, flag, viewer)).rejects.toMatchObject({ status: 409 });
		const vehicle = await requireVehicle(slug);
		const content = emptyContent({ make: 'Quillan', model: 'Flagstaff', yearFrom: 2014, yearTo: 2019, body: 'wagon' });
		content.seats.spaces.push({ id: 'drv', seat: 'driver', lengthMm: 500, widthMm: 400, heightMm: 90, obstacles: '', boardNeeded: false, travelNotes: '' });
		await saveRevision(vehicle.id, { baseRevisionId: vehicle.latestRevisionId!, content, summary: 'Last model year 2019' }, writer);
		await expect(flagField(vehicleId, flag, viewer)).resolves.toHaveProperty('id');
	});

	it(`stops one person at ${FLAGS_PER_PAGE_PER_DAY} flags on a page in a day, even sent all at once`, async () => {
		const content = emptyContent({ make: 'Quillan', model: 'Spamford', yearFrom: 2010, yearTo: 2012, body: 'van' });
		for (const [i, seat] of (['driver', 'passenger', 'rear', 'rear'] as const).entries()) {
			content.seats.spaces.push({ id: `s${i}`, seat, lengthMm: 400 + i, widthMm: 300, heightMm: 80, obstacles: '', boardNeeded: false, travelNotes: '' });
		}
		const page = await requireVehicle((await createVehicle(content, writer)).slug);
		const fields = flaggableFields((await revisionById(page.latestRevisionId!))!.content).map((f) => f.path);
		expect(fields.length).toBeGreaterThan(FLAGS_PER_PAGE_PER_DAY + 5);
		const spammer = await makeUser('viewer', 'Sample Counter');
		const sends = fields
			.slice(0, FLAGS_PER_PAGE_PER_DAY + 5)
			.map((fieldPath) => flagField(page.id, { fieldPath, note: 'This looks wrong to me.' }, spammer).then(() => 'kept', (e) => e.status));
		const outcomes = await Promise.all(sends);
		expect(outcomes.filter((o) => o === 'kept')).toHaveLength(FLAGS_PER_PAGE_PER_DAY);
		expect(outcomes.filter((o) => o === 429)).toHaveLength(5);
		expect(await Confirmation.count({ where: { vehicleId: page.id, userId: spammer.id, kind: 'flag' } })).toBe(FLAGS_PER_PAGE_PER_DAY);
		// Another person's flags are their own.
		await expect(flagField(page.id, { fieldPath: fields[0], note: 'Measured it again: wrong.' }, viewer)).resolves.toHaveProperty('id');
	});
});

describe('names', () => {
	it.each(['Sample\nBcc: everyone@example.test', 'Sample\r\nName', 'Tab\there', 'Line\u2028Sep'])('refuses a name that is not one line: %j', async (name) => {
		await expect(createUser({ email: `n${Math.random()}@kickpanel.test`, name, password: 'long-enough-12', role: 'viewer' }, null)).rejects.toThrow(/one line/);
	});
});
