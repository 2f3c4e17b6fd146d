import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { AuditLog, Vehicle } from '../../src/lib/server/db/models';
import { emptyContent, type VehicleContent } from '../../src/lib/domain/content/schema';
import { createVehicle, listRevisions, revisionById, saveRevision, setRevisionHidden } from '../../src/lib/server/services/revisions';
import { markReviewed, reviewState, setReviewBeforeShow } from '../../src/lib/server/services/review';
import { pageRevision } from '../../src/lib/server/services/visibility';
import { vehicleById } from '../../src/lib/server/services/vehicles';
import { shopSettings } from '../../src/lib/server/services/settings';
import type { SessionUser } from '../../src/lib/domain/sessionUser';

let editor: SessionUser;
let moderator: SessionUser;
let viewer: SessionUser;
let admin: SessionUser;
const pages: Record<string, number> = {};

async function create(key: string, model: string, author: SessionUser) {
	const created = await createVehicle(emptyContent({ make: 'Corrigan', model, yearFrom: 2014, yearTo: 2019, body: 'coupe' }), author);
	pages[key] = (await Vehicle.findOne({ where: { slug: created.slug } }))!.id;
	return created.revisionId;
}

async function edit(key: string, notes: string, author: SessionUser): Promise<number> {
	const vehicle = await Vehicle.findByPk(pages[key]);
	const latest = await revisionById(Number(vehicle!.latestRevisionId));
	const content: VehicleContent = structuredClone(latest!.content);
	content.dash.notes = notes;
	return (await saveRevision(pages[key], { baseRevisionId: latest!.id, content, summary: notes.slice(0, 40) }, author)).revisionId;
}

async function shown(key: string, user: SessionUser) {
	const result = await pageRevision((await vehicleById(pages[key]))!, user);
	return { id: result.revision?.id ?? null, newerAwaitingReview: result.newerAwaitingReview };
}

beforeAll(async () => {
	await freshDatabase('review');
	editor = await makeUser('editor');
	moderator = await makeUser('moderator');
	viewer = await makeUser('viewer');
	admin = await makeUser('admin');
});
afterAll(() => closeDb());

describe('reviewing changes', () => {
	it('counts a moderator’s own edit as reviewed and leaves an editor’s for review', async () => {
		const byEditor = await create('a', 'Lantern', editor);
		const byModerator = await edit('a', 'Dash trim pops off with a plastic tool.', moderator);
		expect(await reviewState(byEditor)).toEqual({ reviewedBy: null, reviewedAt: null });
		expect((await reviewState(byModerator))?.reviewedBy).toBe(moderator.id);
		const unreviewed = await listRevisions(moderator, { unreviewed: true });
		expect(unreviewed.items.map((r) => r.id)).toEqual([byEditor]);
		expect(unreviewed.items[0].reviewedAt).toBeNull();
	});

	it('lets only moderators mark a revision reviewed, once, and logs it', async () => {
		const [{ id }] = (await listRevisions(moderator, { unreviewed: true })).items;
		await expect(markReviewed(id, editor)).rejects.toMatchObject({ status: 403 });
		expect(await markReviewed(id, moderator)).toEqual({ alreadyReviewed: false });
		expect(await markReviewed(id, moderator)).toEqual({ alreadyReviewed: true });
		expect((await listRevisions(moderator, { unreviewed: true })).total).toBe(0);
		expect(await AuditLog.count({ where: { action: 'revision.review', targetId: String(id), actorId: moderator.id } })).toBe(1);
		await expect(markReviewed(999_999, moderator)).rejects.toMatchObject({ status: 404 });
	});
});

describe('review before it shows', () => {
	it('shows everyone the latest revision while the setting is off', async () => {
		const latest = await edit('a', 'Dash trim: start at the left vent.', editor);
		expect((await shopSettings()).reviewBeforeShow).toBe(false);
		expect(await shown('a', viewer)).toEqual({ id: latest, newerAwaitingReview: false });
	});

	it('is switched by admins only and keeps pages as they were at that moment', async () => {
		await expect(setReviewBeforeShow(true, moderator)).rejects.toMatchObject({ status: 403 });
		const before = (await vehicleById(pages.a))!.latestRevisionId;
		await new Promise((r) => setTimeout(r, 10));
		await setReviewBeforeShow(true, admin);
		expect((await shopSettings()).reviewBeforeShow).toBe(true);
		expect(await shown('a', viewer)).toEqual({ id: before, newerAwaitingReview: false });
		expect(await AuditLog.count({ where: { action: 'setting.change', actorId: admin.id } })).toBe(1);
	});

	it('serves viewers the reviewed revision until a moderator reviews the newer one; editors see the newest', async () => {
		const reviewedBefore = (await vehicleById(pages.a))!.latestRevisionId;
		const pendingEdit = await edit('a', 'Dash trim: start at the right vent.', editor);
		expect(await shown('a', viewer)).toEqual({ id: reviewedBefore, newerAwaitingReview: true });
		expect(await shown('a', editor)).toEqual({ id: pendingEdit, newerAwaitingReview: false });
		expect(await shown('a', moderator)).toEqual({ id: pendingEdit, newerAwaitingReview: false });

		await markReviewed(pendingEdit, moderator);
		expect(await shown('a', viewer)).toEqual({ id: pendingEdit, newerAwaitingReview: false });
	});

	it('shows a moderator’s edit to viewers at once', async () => {
		const own = await edit('a', 'Dash trim: both vents, then the cluster hood.', moderator);
		expect(await shown('a', viewer)).toEqual({ id: own, newerAwaitingReview: false });
	});

	it('shows viewers nothing of a page created since, until it is reviewed', async () => {
		const first = await create('b', 'Sable', editor);
		expect(await shown('b', viewer)).toEqual({ id: null, newerAwaitingReview: true });
		await markReviewed(first, moderator);
		expect(await shown('b', viewer)).toEqual({ id: first, newerAwaitingReview: false });
	});

	it('never serves a hidden revision as the reviewed one', async () => {
		const reviewed = await edit('b', 'Head unit cage is a tight fit.', moderator);
		const pendingEdit = await edit('b', 'Head unit cage: see photos.', editor);
		expect(await shown('b', viewer)).toEqual({ id: reviewed, newerAwaitingReview: true });
		await setRevisionHidden(reviewed, true, 'test of hiding', moderator);
		const fallback = await shown('b', viewer);
		expect(fallback.id).not.toBe(reviewed);
		expect(fallback.id).not.toBe(pendingEdit);
		expect(fallback.newerAwaitingReview).toBe(true);
	});

	it('shows everyone the newest again when switched off', async () => {
		await setReviewBeforeShow(false, admin);
		const latest = (await vehicleById(pages.b))!.latestRevisionId;
		expect(await shown('b', viewer)).toEqual({ id: latest, newerAwaitingReview: false });
	});
});
