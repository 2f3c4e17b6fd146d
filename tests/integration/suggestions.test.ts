import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { startTestOutbox, type TestOutbox } from '../helpers/mail';
import { emptyContent, type VehicleContent } from '../../src/lib/domain/content/schema';
import { formEntries, formFromContent } from '../../src/lib/domain/content/formCodec';
import type { SessionUser } from '../../src/lib/domain/sessionUser';
import { db } from '../../src/lib/server/db';
import { EditConflictError } from '../../src/lib/server/errors';
import { createVehicle, revisionById, saveRevision, setProtection } from '../../src/lib/server/services/revisions';
import { applySuggestion, declineSuggestion, listSuggestions, suggestChange, suggestionDetail } from '../../src/lib/server/services/suggestions';
import { editorVehicle, submitSuggestion } from '../../src/lib/server/services/vehicleEditor';
import { vehicleBySlug, type VehicleSummary } from '../../src/lib/server/services/vehicles';

// Invented sample page; every figure below is typed by hand, the expected values are the typed ones.
const SLUG = 'varrow-teal-2014-2019-hatchback';
let writer: SessionUser;
let viewer: SessionUser;
let moderator: SessionUser;
let outbox: TestOutbox;

function withSeat(content: VehicleContent, heightMm: number, lengthMm = 400): VehicleContent {
	const copy = structuredClone(content);
	copy.seats.spaces = [{ id: 'seat-1', seat: 'driver', lengthMm, widthMm: 300, heightMm, obstacles: '', boardNeeded: false, travelNotes: '' }];
	return copy;
}

async function page(): Promise<{ vehicle: VehicleSummary; content: VehicleContent; revisionId: number }> {
	const found = await vehicleBySlug(SLUG);
	if (!found || !('vehicle' in found)) throw new Error('sample page missing');
	const revision = await revisionById(found.vehicle.latestRevisionId!);
	return { vehicle: found.vehicle, content: revision!.content, revisionId: revision!.id };
}

const suggestionRows = async () => (await db().query('SELECT id, status FROM suggestions ORDER BY id', { type: 'SELECT' })) as { id: number; status: string }[];

beforeAll(async () => {
	await freshDatabase('suggestions');
	outbox = await startTestOutbox();
	writer = await makeUser('editor', 'Wren Sample');
	viewer = await makeUser('viewer');
	moderator = await makeUser('moderator', 'Mo Sample');
	await createVehicle(withSeat(emptyContent({ make: 'Varrow', model: 'Teal', yearFrom: 2014, yearTo: 2019, body: 'hatchback' }), 180), moderator);
	const { vehicle } = await page();
	await setProtection(vehicle.id, 'moderators', moderator);
});
afterAll(async () => {
	await outbox.stop();
	await closeDb();
});

describe('suggesting a change to a page locked for moderators', () => {
	it('opens the editor in suggest mode for a writer, in save mode for a moderator', async () => {
		expect((await editorVehicle(SLUG, writer)).mode).toBe('suggest');
		expect((await editorVehicle(SLUG, moderator)).mode).toBe('save');
	});

	it('keeps the typed change with its base revision, from the editor’s own post', async () => {
		const { vehicle, content, revisionId } = await page();
		const posted = new FormData();
		for (const [name, value] of formEntries(formFromContent(content, 'mm'))) posted.append(name, value);
		posted.set('lengthUnit', 'mm');
		posted.set('baseRevisionId', String(revisionId));
		posted.set('summary', 'Driver seat height with the rails down');
		posted.set('seats.spaces.0.heightMm', '172');
		const outcome = await submitSuggestion(vehicle, posted, writer);
		if (!outcome.suggested) throw new Error('not kept');
		const detail = await suggestionDetail(outcome.suggested.id, vehicle.id, writer, 'metric');
		expect(detail.baseRevisionId).toBe(revisionId);
		expect(detail.status).toBe('open');
		expect(detail.changes.map((c) => [c.label, c.before, c.after])).toEqual([[expect.stringContaining('height'), '180 mm', '172 mm']]);
		// Nothing was saved to the page itself.
		expect((await page()).revisionId).toBe(revisionId);
	});

	it('lists it for moderators and for its writer only', async () => {
		const { vehicle } = await page();
		expect((await listSuggestions(moderator, { vehicleId: vehicle.id })).map((s) => s.author.name)).toEqual(['Wren Sample']);
		expect(await listSuggestions(writer)).toHaveLength(1);
		expect(await listSuggestions(viewer)).toEqual([]);
		const otherWriter = await makeUser('editor');
		expect(await listSuggestions(otherWriter)).toEqual([]);
	});

	it('refuses an unchanged suggestion, a viewer, and a base from another page, writing nothing', async () => {
		const { vehicle, content, revisionId } = await page();
		const before = (await suggestionRows()).length;
		await expect(suggestChange(vehicle, { baseRevisionId: revisionId, content, summary: '' }, writer)).rejects.toMatchObject({ status: 400, message: expect.stringContaining('Nothing to suggest') });
		await expect(suggestChange(vehicle, { baseRevisionId: revisionId, content: withSeat(content, 150), summary: '' }, viewer)).rejects.toMatchObject({ status: 403 });
		await expect(suggestChange(vehicle, { baseRevisionId: 999_999, content: withSeat(content, 150), summary: '' }, writer)).rejects.toMatchObject({ status: 400 });
		expect((await suggestionRows()).length).toBe(before);
	});

	it('applies through the normal save, merged with an edit saved since, and tells the writer', async () => {
		const { vehicle } = await page();
		const [open] = await listSuggestions(moderator, { vehicleId: vehicle.id });
		// A moderator changes another figure (the length) after the suggestion was made: both end up on the page.
		const now = await page();
		await saveRevision(vehicle.id, { baseRevisionId: now.revisionId, content: withSeat(now.content, 180, 420), summary: 'Length re-measured' }, moderator);
		const saved = await applySuggestion(open.id, moderator, '');
		expect(saved.merged).toBe(true);
		const after = await page();
		expect(after.content.seats.spaces[0]).toMatchObject({ heightMm: 172, lengthMm: 420 });
		const revision = await revisionById(saved.revisionId);
		expect(revision!.summary).toBe('Driver seat height with the rails down (suggested by Wren Sample)');
		expect((await suggestionRows()).find((r) => r.id === open.id)?.status).toBe('applied');
		await expect.poll(async () => (await outbox.to(writer.email)).map((m) => m.subject)).toContain(`Mo Sample applied your suggested change to ${vehicle.title}`);
		// A second answer is refused.
		await expect(declineSuggestion(open.id, moderator, 'late')).rejects.toMatchObject({ status: 409 });
	});

	it('shows a conflict instead of applying when a field was changed both ways, and leaves the suggestion open', async () => {
		const { vehicle, content, revisionId } = await page();
		const { id } = await suggestChange(vehicle, { baseRevisionId: revisionId, content: withSeat(content, 160, 420), summary: 'Height again' }, writer);
		await saveRevision(vehicle.id, { baseRevisionId: revisionId, content: withSeat(content, 165, 420), summary: 'Height by the moderator' }, moderator);
		const latest = (await page()).revisionId;
		const refusal = await applySuggestion(id, moderator, '').catch((err) => err);
		expect(refusal).toBeInstanceOf(EditConflictError);
		expect((refusal as EditConflictError).meanwhile).toMatchObject({ by: 'Mo Sample' });
		expect((refusal as EditConflictError).conflicts.map((c) => [c.theirs, c.yours])).toEqual([[165, 160]]);
		expect((await page()).revisionId).toBe(latest);
		expect((await suggestionRows()).find((r) => r.id === id)?.status).toBe('open');
	});

	it('declines with a note, which the writer reads by mail', async () => {
		const { vehicle } = await page();
		const [open] = await listSuggestions(moderator, { vehicleId: vehicle.id });
		await expect(declineSuggestion(open.id, writer, 'not mine to answer')).rejects.toMatchObject({ status: 403 });
		await declineSuggestion(open.id, moderator, 'Measured again with the rails down: 165 mm stands');
		expect((await suggestionRows()).find((r) => r.id === open.id)?.status).toBe('declined');
		await expect
			.poll(async () => (await outbox.to(writer.email)).find((m) => m.subject.includes('declined'))?.text ?? '')
			.toContain('Note from Mo Sample: Measured again with the rails down: 165 mm stands');
	});

	it('refuses a suggestion once the page is open to every writer again', async () => {
		const { vehicle, content, revisionId } = await page();
		await setProtection(vehicle.id, 'none', moderator);
		const open = (await page()).vehicle;
		await expect(suggestChange(open, { baseRevisionId: revisionId, content: withSeat(content, 150, 420), summary: '' }, writer)).rejects.toMatchObject({ status: 409 });
		await setProtection(vehicle.id, 'moderators', moderator);
	});
});
