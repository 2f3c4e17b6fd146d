import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { emptyContent, type VehicleContent } from '../../src/lib/domain/content/schema';
import { formEntries, formFromContent } from '../../src/lib/domain/content/formCodec';
import type { LengthUnit } from '../../src/lib/domain/units';
import type { SessionUser } from '../../src/lib/domain/sessionUser';
import { EditConflictError, ServiceError } from '../../src/lib/server/errors';
import { createVehicle, revisionById, setProtection } from '../../src/lib/server/services/revisions';
import { editableVehicle, editorStart, editorValuesAfter, submitEditor } from '../../src/lib/server/services/vehicleEditor';

let writer: SessionUser;
let other: SessionUser;
let moderator: SessionUser;
const SLUG = 'ondrel-skiff-2016-2019-wagon';

function withSeat(content: VehicleContent, heightMm: number): VehicleContent {
	const copy = structuredClone(content);
	copy.seats.spaces.push({ id: 'seat-1', seat: 'driver', lengthMm: 400, widthMm: 300, heightMm, obstacles: '', boardNeeded: false, travelNotes: '' });
	return copy;
}

/** What the editor's form posts for this content, as typed in `unit`. */
function editorPost(content: VehicleContent, baseRevisionId: number, fields: Record<string, string> = {}, unit: LengthUnit = 'mm'): FormData {
	const posted = new FormData();
	for (const [name, value] of formEntries(formFromContent(content, unit))) posted.append(name, value);
	posted.set('lengthUnit', unit);
	posted.set('baseRevisionId', String(baseRevisionId));
	posted.set('summary', 'Seat space under the driver');
	for (const [name, value] of Object.entries(fields)) posted.set(name, value);
	return posted;
}

async function current() {
	const vehicle = await editableVehicle(SLUG, writer);
	const revision = await revisionById(vehicle.latestRevisionId!);
	return { vehicle, revision: revision! };
}

beforeAll(async () => {
	await freshDatabase('editor');
	writer = await makeUser('editor');
	other = await makeUser('editor');
	moderator = await makeUser('moderator');
	const content = withSeat(emptyContent({ make: 'Ondrel', model: 'Skiff', yearFrom: 2016, yearTo: 2019, body: 'wagon' }), 180);
	await createVehicle(content, writer);
});
afterAll(() => closeDb());

describe('the vehicle editor as a use case', () => {
	it('opens on the current revision as form text in the reader’s unit', async () => {
		const { vehicle, revision } = await current();
		const start = await editorStart(vehicle, 'in');
		expect(start.baseRevisionId).toBe(revision.id);
		// 180 mm / 25.4 mm per inch = 7.0866 in (exact inch definition, NIST SP 811 Appendix B).
		expect(Number(start.draft.seats.spaces[0].heightMm)).toBeCloseTo(7.09, 2);
	});

	it('saves a length typed in inches as millimetres', async () => {
		const { vehicle, revision } = await current();
		const outcome = await submitEditor(vehicle, editorPost(revision.content, revision.id, { 'seats.spaces.0.heightMm': '8' }, 'in'), writer);
		expect(outcome.saved).not.toBeNull();
		const saved = await revisionById(outcome.saved!.revisionId);
		// 8 in × 25.4 mm/in = 203.2 mm (exact inch definition, NIST SP 811 Appendix B).
		expect(saved!.content.seats.spaces[0].heightMm).toBeCloseTo(203.2, 3);
		expect(saved!.parentId).toBe(revision.id);
	});

	it('adds a row without saving when scripts are off', async () => {
		const { vehicle, revision } = await current();
		const outcome = await submitEditor(vehicle, editorPost(revision.content, revision.id, { intent: 'add:seats.spaces' }), writer);
		expect(outcome.saved).toBeNull();
		if (outcome.saved) return;
		expect(outcome.values.draft.seats.spaces).toHaveLength(2);
		expect((await current()).revision.id).toBe(revision.id);
	});

	it('refuses a field it cannot read, naming the input, and shows the typed text again', async () => {
		const { vehicle, revision } = await current();
		const posted = editorPost(revision.content, revision.id, { 'seats.spaces.0.lengthMm': 'about a foot' });
		const refusal = await submitEditor(vehicle, posted, writer).catch((err) => err);
		expect(refusal).toBeInstanceOf(ServiceError);
		expect(refusal.status).toBe(400);
		expect(Object.keys(refusal.fieldErrors)).toEqual(['seats.spaces.0.lengthMm']);
		expect(editorValuesAfter(posted, refusal).draft.seats.spaces[0].lengthMm).toBe('about a foot');
	});

	it('refuses a base revision from another page and a save that changes nothing', async () => {
		const { vehicle, revision } = await current();
		await expect(submitEditor(vehicle, editorPost(revision.content, 999_999), writer)).rejects.toMatchObject({ status: 400, message: expect.stringContaining('not part of this page') });
		await expect(submitEditor(vehicle, editorPost(revision.content, revision.id), writer)).rejects.toMatchObject({ status: 400, message: expect.stringContaining('No change') });
	});

	it('turns racing saves of the same field into conflicts to settle, then saves the choice', async () => {
		const { vehicle, revision } = await current();
		await submitEditor(vehicle, editorPost(revision.content, revision.id, { 'seats.spaces.0.heightMm': '190' }), other);
		const mine = editorPost(revision.content, revision.id, { 'seats.spaces.0.heightMm': '210' });
		const refusal = await submitEditor(vehicle, mine, writer).catch((err) => err);
		expect(refusal).toBeInstanceOf(EditConflictError);
		const shown = editorValuesAfter(mine, refusal);
		const latest = (await current()).revision;
		expect(shown.baseRevisionId).toBe(latest.id);
		expect(shown.conflicts).toHaveLength(1);

		const settled = editorPost(latest.content, shown.baseRevisionId, { 'seats.spaces.0.heightMm': '210', conflicts: shown.conflictsJson, 'resolve.0': 'theirs' });
		settled.set('seats.spaces.0.widthMm', '310');
		const outcome = await submitEditor(vehicle, settled, writer);
		const saved = await revisionById(outcome.saved!.revisionId);
		expect(saved!.content.seats.spaces[0].heightMm).toBe(190);
		expect(saved!.content.seats.spaces[0].widthMm).toBe(310);
	});

	it('keeps editors out of a protected page', async () => {
		const { vehicle } = await current();
		await setProtection(vehicle.id, 'moderators', moderator);
		await expect(editableVehicle(SLUG, writer)).rejects.toMatchObject({ status: 403 });
		await expect(editableVehicle('no-such-page', writer)).rejects.toMatchObject({ status: 404 });
	});
});
