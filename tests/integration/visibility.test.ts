import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { createHash } from 'node:crypto';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { seatSpace } from '../helpers/places';
import { db } from '../../src/lib/server/db';
import { PendingNotice, Vehicle, Watch } from '../../src/lib/server/db/models';
import { emptyContent, type VehicleContent } from '../../src/lib/domain/content/schema';
import type { SessionUser } from '../../src/lib/domain/sessionUser';
import {
	compareRevisions,
	createVehicle,
	forgetAllRevisionFlags,
	listRevisions,
	revisionById,
	saveRevision,
	setRevisionHidden
} from '../../src/lib/server/services/revisions';
import { markReviewed, setReviewBeforeShow } from '../../src/lib/server/services/review';
import { catalogue, countOpenVehicles, listVehicles, makesWithPages, vehicleById, vehicleBySlug } from '../../src/lib/server/services/vehicles';
import { confirmPage, flagField, trustSummary } from '../../src/lib/server/services/trust';
import { pageRevision, readableRevision, requirePageRevision } from '../../src/lib/server/services/visibility';
import { photoVisibleTo } from '../../src/lib/server/services/photos';
import { checkVehicleFit, vehicleFitFacts, vehiclesForBox } from '../../src/lib/server/services/fit';
import { queueNotices } from '../../src/lib/server/services/watch';
import { resetSeatSpaceIndex } from '../../src/lib/server/fit';
import { LiveSearchIndex } from '../../src/lib/server/search';
import { SHARED_STATE_TTL_MS } from '../../src/lib/server/cache';
import { forgetShopSettings } from '../../src/lib/server/services/settings';
import { EditConflictError } from '../../src/lib/server/errors';

// Who reads what: a hidden revision only moderators and admins; with sign-off required, viewers only
// signed-off revisions (or ones saved before it was required) and no page nobody signed off. Every reader
// of page content is asked the same question here.

let viewer: SessionUser;
let editor: SessionUser;
let moderator: SessionUser;
let admin: SessionUser;

const HIDDEN = 'wordhiddenvalue';
const UNSIGNED = 'wordunsignedvalue';
const photoId = (s: string) => createHash('sha256').update(s).digest('hex');
const UNSIGNED_PHOTO = photoId('unsigned photo');
const SIGNED_PHOTO = photoId('signed photo');

/** Page A: signed-off seat 400 mm long, then a hidden revision, then an unsigned one (seat 900 mm long). */
const A: { id: number; slug: string; signed: number; hidden: number; unsigned: number } = { id: 0, slug: '', signed: 0, hidden: 0, unsigned: 0 };
/** Page B: created after sign-off was required, never signed off. */
const B: { id: number; slug: string; first: number } = { id: 0, slug: '', first: 0 };

async function edit(vehicleId: number, author: SessionUser, change: (c: VehicleContent) => void, summary: string): Promise<number> {
	const v = (await vehicleById(vehicleId))!;
	const latest = (await revisionById(v.latestRevisionId!))!;
	const content = structuredClone(latest.content);
	change(content);
	return (await saveRevision(vehicleId, { baseRevisionId: latest.id, content, summary }, author)).revisionId;
}

const page = async (id: number) => (await vehicleById(id))!;

beforeAll(async () => {
	await freshDatabase('visibility');
	forgetShopSettings();
	[viewer, editor, moderator, admin] = await Promise.all([makeUser('viewer'), makeUser('editor'), makeUser('moderator'), makeUser('admin')]);
	const made = await createVehicle(emptyContent({ make: 'Ostrel', model: 'Vanta', yearFrom: 2015, yearTo: 2019, body: 'hatchback' }), moderator);
	A.slug = made.slug;
	A.id = (await Vehicle.findOne({ where: { slug: made.slug } }))!.id;
	A.signed = await edit(A.id, moderator, (c) => {
		c.seats.spaces = [seatSpace('s1', 'driver', 400, 300, 100)];
		c.photos = [{ id: SIGNED_PHOTO, section: 'seats', itemId: null, caption: 'Seat rail', alt: 'Seat rail' }];
	}, 'Seat measured');
	A.hidden = await edit(A.id, editor, (c) => (c.identity.notes = `Customer phone ${HIDDEN}`), 'Notes');
	await edit(A.id, editor, (c) => (c.identity.notes = 'Notes without customer details'), 'Notes tidied');
	await setRevisionHidden(A.hidden, true, 'customer details', moderator);
	await new Promise((r) => setTimeout(r, 10));
	await setReviewBeforeShow(true, admin);
	A.unsigned = await edit(A.id, editor, (c) => {
		c.identity.notes = `Unchecked ${UNSIGNED}`;
		c.seats.spaces = [seatSpace('s1', 'driver', 900, 300, 100)];
		c.photos.push({ id: UNSIGNED_PHOTO, section: 'seats', itemId: null, caption: 'New rail', alt: 'New rail' });
	}, `Unchecked ${UNSIGNED}`);
	const made2 = await createVehicle(emptyContent({ make: 'Ostrel', model: 'Brandle', yearFrom: 2020, yearTo: 2023, body: 'sedan' }), editor);
	B.slug = made2.slug;
	B.first = made2.revisionId;
	B.id = (await Vehicle.findOne({ where: { slug: made2.slug } }))!.id;
});
afterAll(async () => {
	vi.useRealTimers();
	await closeDb();
});

describe('the revision each person reads as the page', () => {
	it('gives viewers the newest signed-off revision, editors and moderators the newest', async () => {
		const older = (await pageRevision(await page(A.id), viewer)).revision!;
		// Saved before sign-off was required and not hidden: the tidied notes.
		expect(older.id).toBeGreaterThan(A.hidden);
		expect(older.id).toBeLessThan(A.unsigned);
		expect(JSON.stringify(older.content)).not.toContain(UNSIGNED);
		expect((await pageRevision(await page(A.id), viewer)).newerAwaitingReview).toBe(true);
		expect((await pageRevision(await page(A.id), editor)).revision!.id).toBe(A.unsigned);
		expect((await pageRevision(await page(A.id), moderator)).revision!.id).toBe(A.unsigned);
	});

	it('has no page for a viewer when nobody signed it off; the 404 names no value', async () => {
		expect((await pageRevision(await page(B.id), viewer)).revision).toBeNull();
		await expect(requirePageRevision(await page(B.id), viewer)).rejects.toMatchObject({ status: 404 });
		expect((await requirePageRevision(await page(B.id), editor)).id).toBe(B.first);
	});

	it('opens a given revision only to those who may read it', async () => {
		expect(await readableRevision(A.id, A.hidden, editor)).toBeNull();
		expect((await readableRevision(A.id, A.hidden, moderator))?.id).toBe(A.hidden);
		expect(await readableRevision(A.id, A.unsigned, viewer)).toBeNull();
		expect((await readableRevision(A.id, A.unsigned, editor))?.id).toBe(A.unsigned);
		expect(await readableRevision(B.id, A.signed, moderator)).toBeNull();
	});
});

describe('lists and comparisons', () => {
	it('lists no unsigned change to a viewer and no hidden summary below moderator', async () => {
		const forViewer = await listRevisions(viewer, { vehicleId: A.id });
		expect(forViewer.items.map((r) => r.id)).not.toContain(A.unsigned);
		expect(forViewer.items.find((r) => r.id === A.hidden)).toMatchObject({ hidden: true, summary: '' });
		const forEditor = await listRevisions(editor, { vehicleId: A.id });
		expect(forEditor.items.map((r) => r.id)).toContain(A.unsigned);
		expect(forEditor.items.find((r) => r.id === A.hidden)?.summary).toBe('');
		expect((await listRevisions(moderator, { vehicleId: A.id })).items.find((r) => r.id === A.hidden)?.summary).toBe('Notes');
		expect((await listRevisions(viewer, {})).items.map((r) => r.vehicleId)).not.toContain(B.id);
	});

	it('leaves a page nobody signed off out of a viewer’s page lists and catalogue', async () => {
		expect((await listVehicles(viewer, {})).items.map((v) => v.id)).toEqual([A.id]);
		expect((await listVehicles(editor, {})).items.map((v) => v.id).sort()).toEqual([A.id, B.id].sort());
		const models = (await catalogue(viewer)).flatMap((m) => m.models.map((mo) => mo.name));
		expect(models).toEqual(['Vanta']);
		// The fit screen's count and make picker follow the same rule.
		expect(await countOpenVehicles(viewer)).toBe(1);
		expect(await countOpenVehicles(editor)).toBe(2);
		expect(await makesWithPages(viewer)).toEqual([{ name: 'Ostrel', slug: 'ostrel' }]);
	});

	it('compares only revisions the person may read', async () => {
		await expect(compareRevisions(A.id, A.signed, A.unsigned, viewer, 'metric')).rejects.toMatchObject({ status: 404 });
		expect((await compareRevisions(A.id, A.signed, A.unsigned, editor, 'metric')).to.id).toBe(A.unsigned);
		await expect(compareRevisions(A.id, A.signed, A.hidden, editor, 'metric')).rejects.toMatchObject({ status: 403 });
	});
});

describe('saving from a revision the author may not read', () => {
	it('refuses an editor’s save based on a hidden revision, naming none of its values', async () => {
		const latest = (await revisionById((await page(A.id)).latestRevisionId!))!;
		const content = structuredClone(latest.content);
		content.identity.notes = 'Something else entirely';
		const refusal = await saveRevision(A.id, { baseRevisionId: A.hidden, content, summary: 'x' }, editor).catch((e: unknown) => e);
		expect(refusal).toMatchObject({ status: 400 });
		expect(refusal).not.toBeInstanceOf(EditConflictError);
		expect(JSON.stringify(refusal) + String((refusal as Error).message)).not.toContain(HIDDEN);
	});

	it('still merges a moderator’s save based on it (they may read it)', async () => {
		const latest = (await revisionById((await page(A.id)).latestRevisionId!))!;
		const content = structuredClone(latest.content);
		content.identity.notes = 'Moderator’s own words';
		const refusal = await saveRevision(A.id, { baseRevisionId: A.hidden, content, summary: 'x' }, moderator).catch((e: unknown) => e);
		expect(refusal).toBeInstanceOf(EditConflictError);
	});
});

describe('photos', () => {
	it('serves a photo of an unsigned revision to editors only, and one of a signed-off revision to all', async () => {
		expect(await photoVisibleTo(UNSIGNED_PHOTO, viewer)).toBe(false);
		expect(await photoVisibleTo(UNSIGNED_PHOTO, editor)).toBe(true);
		expect(await photoVisibleTo(SIGNED_PHOTO, viewer)).toBe(true);
	});
});

describe('fit screen, reverse scan and search', () => {
	it('checks a part against the seat a viewer may read', async () => {
		const forViewer = await vehicleFitFacts(await page(A.id), viewer);
		expect(forViewer!.places.seats[0].lengthMm).toBe(400);
		expect((await vehicleFitFacts(await page(A.id), editor))!.places.seats[0].lengthMm).toBe(900);
		expect(await vehicleFitFacts(await page(B.id), viewer)).toBeNull();
		// 500 mm box: fits 900, not 400 (the difference is the unsigned change).
		const box = { l: 500, w: 100, h: 50 };
		const answer = await checkVehicleFit({ vehicle: A.slug, box, seat: 'driver' }, viewer);
		expect(answer.check === 'seat' && answer.chosen?.result.verdict).toBe('no-fit');
		await expect(checkVehicleFit({ vehicle: B.slug, box }, viewer)).rejects.toMatchObject({ status: 404 });
	});

	it('finds in the reverse scan only what everyone may read, until it is signed off', async () => {
		resetSeatSpaceIndex();
		const box = { l: 500, w: 100, h: 50 };
		expect((await vehiclesForBox(box)).matches.map((m) => m.vehicleSlug)).toEqual([]);
		await markReviewed(A.unsigned, moderator);
		expect((await vehiclesForBox(box)).matches.map((m) => m.vehicleSlug)).toEqual([A.slug]);
	});

	it('indexes for search only the revision everyone may read', async () => {
		const index = new LiveSearchIndex();
		index.start({ pollMs: 0, listen: false });
		const hits = async (q: string) => (await index.search({ q, conditions: [] }, { limit: 10 })).items.map((h) => h.slug);
		expect(await hits(UNSIGNED)).toEqual([A.slug]);
		expect(await hits('Brandle')).toEqual([]);
		expect(await hits(HIDDEN)).toEqual([]);
		const later = await edit(A.id, editor, (c) => (c.identity.notes = 'wordlaterchange'), 'later');
		await index.refresh([A.id]);
		expect(await hits('wordlaterchange')).toEqual([]);
		await markReviewed(later, moderator);
		await index.refresh([A.id]);
		expect(await hits('wordlaterchange')).toEqual([A.slug]);
		index.stop();
	});

	it('catches up with a sign-off and a hide made on another server by polling', async () => {
		const index = new LiveSearchIndex();
		index.start({ pollMs: 0, listen: false });
		const hits = async (q: string) => (await index.search({ q, conditions: [] }, { limit: 10 })).items.map((h) => h.slug);
		const change = await edit(A.id, editor, (c) => (c.identity.notes = 'wordpolledchange'), 'polled');
		await index.ready();
		expect(await hits('wordpolledchange')).toEqual([]);
		// Signed off elsewhere: no new revision, only the page row is touched.
		await markReviewed(change, moderator);
		expect(await index.catchUp()).toBe(1);
		expect(await hits('wordpolledchange')).toEqual([A.slug]);
		// Hidden elsewhere, once a newer unsigned change sits on top: the index falls back to an older revision.
		await edit(A.id, editor, (c) => (c.identity.notes = 'wordontop'), 'on top');
		await setRevisionHidden(change, true, 'test', moderator);
		expect(await index.catchUp()).toBe(1);
		expect(await hits('wordpolledchange')).toEqual([]);
		expect(await hits('wordontop')).toEqual([]);
		index.stop();
	});
});

describe('notices', () => {
	it('tells a watching viewer of a change only once it is signed off', async () => {
		await Watch.bulkCreate([{ userId: viewer.id, vehicleId: A.id }, { userId: moderator.id, vehicleId: A.id }], { ignoreDuplicates: true });
		const change = await edit(A.id, editor, (c) => (c.identity.notes = 'wordnoticechange'), 'notice change');
		await queueNotices({ kind: 'save', vehicleId: A.id, revisionId: change, authorId: editor.id });
		expect(await PendingNotice.count({ where: { revisionId: change, userId: viewer.id } })).toBe(0);
		expect(await PendingNotice.count({ where: { revisionId: change, userId: moderator.id } })).toBe(1);
		await markReviewed(change, moderator);
		await queueNotices({ kind: 'review', vehicleId: A.id, revisionId: change, authorId: moderator.id });
		expect(await PendingNotice.count({ where: { revisionId: change, userId: viewer.id } })).toBe(1);
		expect(await PendingNotice.count({ where: { revisionId: change, userId: moderator.id } })).toBe(1);
	});
});

describe('hides and sign-offs made on another app server', () => {
	it('reach this server’s revision cache within the shared-state time limit', async () => {
		const latest = (await page(A.id)).latestRevisionId!;
		const target = (await revisionById(latest))!.parentId!;
		expect((await revisionById(target))!.hidden).toBe(false);
		// Another server hides it: only the database changes, this process's cache is not told.
		await db().query('UPDATE revisions SET hidden = 1 WHERE id = ?', { replacements: [target] });
		vi.useFakeTimers({ toFake: ['Date'] });
		vi.setSystemTime(Date.now() + SHARED_STATE_TTL_MS + 1);
		expect((await revisionById(target))!.hidden).toBe(true);
		expect(await readableRevision(A.id, target, editor)).toBeNull();
		vi.useRealTimers();
	});

	it('reach it at once when the kept flags are dropped, as on a fresh server, with the content still kept', async () => {
		const revision = await edit(A.id, editor, (c) => (c.identity.notes = 'wordotherserver'), 'other server');
		expect(await readableRevision(A.id, revision, viewer)).toBeNull();
		await db().query('UPDATE revisions SET reviewed_at = NOW(3), reviewed_by = ? WHERE id = ?', { replacements: [moderator.id, revision] });
		forgetAllRevisionFlags();
		expect((await readableRevision(A.id, revision, viewer))?.content.identity.notes).toBe('wordotherserver');
		expect((await pageRevision(await page(A.id), viewer)).revision?.id).toBe(revision);
	});
});

describe('a page renamed by a change nobody has signed off', () => {
	let C = { id: 0, slug: '' };
	beforeAll(async () => {
		const made = await createVehicle(emptyContent({ make: 'Ostrel', model: 'Corvin', yearFrom: 2010, yearTo: 2014, body: 'sedan' }), moderator);
		C = { id: (await Vehicle.findOne({ where: { slug: made.slug } }))!.id, slug: made.slug };
	});

	it('keeps the signed-off name in lists, the catalogue and its address until a moderator signs the rename off', async () => {
		const rename = await edit(C.id, editor, (c) => (c.identity.model = 'Wordrenamed'), 'Rename');
		const row = await page(C.id);
		expect(row.slug).toBe(C.slug);
		expect(row.title).toBe('Ostrel Corvin 2010–2014');
		expect((await listVehicles(viewer, {})).items.map((v) => v.title)).not.toContain(expect.stringContaining('Wordrenamed'));
		expect((await catalogue(viewer)).flatMap((m) => m.models.map((mo) => mo.name))).not.toContain('Wordrenamed');
		// The writer reads the new name in the page itself.
		expect((await pageRevision(row, editor)).revision?.content.identity.model).toBe('Wordrenamed');

		await markReviewed(rename, moderator);
		const signed = await page(C.id);
		expect(signed.title).toBe('Ostrel Wordrenamed 2010–2014');
		expect(signed.slug).not.toBe(C.slug);
		// The old address still leads to the page.
		expect(await vehicleBySlug(C.slug)).toMatchObject({ redirectTo: signed.slug });
	});

	it('takes a moderator’s rename at once, and waiting renames when sign-off is switched off', async () => {
		await edit(C.id, moderator, (c) => (c.identity.model = 'Corvin'), 'Name back');
		expect((await page(C.id)).title).toBe('Ostrel Corvin 2010–2014');
		await edit(C.id, editor, (c) => (c.identity.yearTo = 2016), 'Years');
		expect((await page(C.id)).yearTo).toBe(2014);
		await setReviewBeforeShow(false, admin);
		try {
			expect((await page(C.id)).yearTo).toBe(2016);
		} finally {
			await setReviewBeforeShow(true, admin);
		}
	});

	it('labels trust marks from the revision the reader reads, and lets a viewer mark that revision', async () => {
		await edit(C.id, moderator, (c) => (c.seats.spaces = [seatSpace('s1', 'driver', 400, 300, 100)]), 'Seat');
		const signedId = (await page(C.id)).latestRevisionId!;
		await edit(C.id, editor, (c) => (c.seats.spaces = [seatSpace('s1', 'driver', 700, 300, 100)]), 'Seat longer');
		const latestId = (await page(C.id)).latestRevisionId!;
		expect((await pageRevision(await page(C.id), viewer)).revision?.id).toBe(signedId);
		// A viewer marks what they read; before, the unsigned newer revision made every viewer's mark a 409.
		await expect(confirmPage(C.id, { revisionId: signedId }, viewer)).resolves.toMatchObject({ created: true });
		await expect(confirmPage(C.id, { revisionId: latestId }, viewer)).rejects.toMatchObject({ status: 409 });
		await flagField(C.id, { revisionId: signedId, fieldPath: 'seats.spaces[s1].lengthMm', note: 'length looks short' }, viewer);
		const forViewer = await trustSummary(C.id, signedId);
		expect(forViewer.openFlags[0].value).toContain('400');
		expect(JSON.stringify(forViewer)).not.toContain('700');
	});
});

describe('the fit screen’s make picker', () => {
	it('lists a make only to those who may open one of its pages', async () => {
		await createVehicle(emptyContent({ make: 'Quennet', model: 'Sarl', yearFrom: 2012, yearTo: 2016, body: 'wagon' }), editor);
		expect((await makesWithPages(viewer)).map((m) => m.name)).not.toContain('Quennet');
		expect((await makesWithPages(editor)).map((m) => m.name)).toEqual(['Ostrel', 'Quennet']);
		expect(await countOpenVehicles(editor)).toBe((await listVehicles(editor, {})).total);
		// The catalogue for browsing: makes by name, each with its models by name and the pages each reader may open.
		const forEditor = (await catalogue(editor)).filter((m) => m.models.length > 0);
		expect(forEditor.find((m) => m.name === 'Quennet')?.models).toEqual([{ name: 'Sarl', slug: 'sarl', pages: 1 }]);
		const makeNames = forEditor.map((m) => m.name);
		expect(makeNames).toEqual([...makeNames].sort());
		for (const make of forEditor) {
			const modelNames = make.models.map((mo) => mo.name);
			expect(modelNames).toEqual([...modelNames].sort((x, y) => x.localeCompare(y)));
			expect(make.models.every((mo) => mo.pages > 0)).toBe(true);
		}
		expect((await catalogue(viewer)).find((m) => m.name === 'Quennet')?.models).toEqual([]);
	});
});

