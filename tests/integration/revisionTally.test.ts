import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { Revision, Vehicle } from '../../src/lib/server/db/models';
import { emptyContent, type VehicleContent } from '../../src/lib/domain/content/schema';
import { createVehicle, listRevisions, revisionById, saveRevision, setRevisionHidden } from '../../src/lib/server/services/revisions';
import { withTallies } from '../../src/lib/server/services/revisionTally';
import type { SessionUser } from '../../src/lib/domain/sessionUser';

// Every expected count is worked by hand from the one edit each revision makes.
let editor: SessionUser;
let moderator: SessionUser;
let vehicleId: number;

async function edit(fn: (c: VehicleContent) => void, summary: string): Promise<number> {
	const vehicle = await Vehicle.findByPk(vehicleId);
	const latest = await revisionById(Number(vehicle!.latestRevisionId));
	const content = structuredClone(latest!.content);
	fn(content);
	return (await saveRevision(vehicleId, { baseRevisionId: latest!.id, content, summary }, editor)).revisionId;
}

const tallyOf = async (id: number) => {
	const listed = await withTallies((await listRevisions(moderator, { vehicleId })).items);
	return listed.find((r) => r.id === id)!.tally;
};

beforeAll(async () => {
	await freshDatabase('revision_tally');
	editor = await makeUser('editor');
	moderator = await makeUser('moderator');
});
afterAll(() => closeDb());

describe('what each listed revision changed', () => {
	it('has no count for a new page, then counts a seat space with its two sizes and a note', async () => {
		const created = await createVehicle(emptyContent({ make: 'Corrigan', model: 'Tally', yearFrom: 2014, yearTo: 2019, body: 'coupe' }), editor);
		vehicleId = (await Vehicle.findOne({ where: { slug: created.slug } }))!.id;
		expect(await tallyOf(created.revisionId)).toBeNull();

		const added = await edit((c) => {
			c.seats.spaces.push({ id: 'drv', seat: 'driver', lengthMm: 480, widthMm: 360, heightMm: null, obstacles: '', boardNeeded: false, travelNotes: '' } as never);
			c.seats.notes = 'Measured with the seat fully back.';
		}, 'driver seat space');
		expect(await tallyOf(added)).toEqual({ fields: 1, notes: 1, measurements: 2 });
	});

	it('counts a wording change without a measurement, and a re-measure as one', async () => {
		const worded = await edit((c) => (c.seats.spaces[0].obstacles = 'Floor ridge at the front'), 'obstacles');
		const measured = await edit((c) => (c.seats.spaces[0].lengthMm = 470), 'length again');
		expect(await tallyOf(worded)).toEqual({ fields: 1, notes: 0, measurements: 0 });
		expect(await tallyOf(measured)).toEqual({ fields: 1, notes: 0, measurements: 1 });
	});

	it('shows no count for a hidden revision', async () => {
		const [newest] = (await listRevisions(moderator, { vehicleId })).items;
		const older = await Revision.findOne({ where: { vehicleId }, order: [['id', 'ASC']], offset: 1 });
		await setRevisionHidden(Number(older!.id), true, 'testing the tally', moderator);
		const listed = await withTallies((await listRevisions(moderator, { vehicleId })).items);
		expect(listed.find((r) => r.id === Number(older!.id))!.tally).toBeNull();
		expect(listed.find((r) => r.id === newest.id)!.tally).toEqual({ fields: 1, notes: 0, measurements: 1 });
	});
});
