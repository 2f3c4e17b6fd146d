import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { closeDb, freshDatabase } from '../helpers/database';
import { statementsDuring } from '../helpers/statements';
import { makeUser } from '../helpers/users';
import { seatSpace } from '../helpers/places';
import { db } from '../../src/lib/server/db';
import { emptyContent, type VehicleContent } from '../../src/lib/domain/content/schema';
import type { SessionUser } from '../../src/lib/domain/sessionUser';
import type { UnitSystem } from '../../src/lib/domain/units';
import { createVehicle, restoreRevision, revisionById, saveRevision, setRevisionHidden } from '../../src/lib/server/services/revisions';
import { vehicleById } from '../../src/lib/server/services/vehicles';
import { markReviewed, setReviewBeforeShow } from '../../src/lib/server/services/review';
import { forgetShopSettings } from '../../src/lib/server/services/settings';
import { vehiclePageData } from '../../src/lib/server/views/vehiclePage';
import { RENDERER } from '../../src/lib/server/render/readingPage';
import { forgetOtherBuilds, PAGE_SQL } from '../../src/lib/server/services/renderedPages';
import { confirmPage, flagField, forgetTrustSummaries, trustSummary } from '../../src/lib/server/services/trust';

// The reading view's stored parts: written with each revision, shared by every reader, and never showing a
// reader a body they may not read or one older than the page.

let viewer: SessionUser;
let editor: SessionUser;
let moderator: SessionUser;
let admin: SessionUser;
let slug = '';
let vehicleId = 0;

async function view(user: SessionUser, units: UnitSystem = 'metric', pageSlug = slug) {
	const locals = { user, units } as App.Locals;
	return vehiclePageData({ locals, params: { slug: pageSlug }, url: new URL(`http://kickpanel.test/vehicles/${pageSlug}`), isDataRequest: true });
}

/** Everything the body shows, as one string. */
async function bodyText(user: SessionUser, units: UnitSystem = 'metric') {
	return JSON.stringify((await view(user, units)).body);
}

async function edit(author: SessionUser, change: (c: VehicleContent) => void, summary: string): Promise<number> {
	const latest = (await revisionById((await vehicleById(vehicleId))!.latestRevisionId!))!;
	const content = structuredClone(latest.content);
	change(content);
	return (await saveRevision(vehicleId, { baseRevisionId: latest.id, content, summary }, author)).revisionId;
}

async function keptUnits(revisionId: number) {
	const sha = (await revisionById(revisionId))!.sha256;
	const rows = await db().query<{ units: string }>('SELECT units FROM rendered_pages WHERE sha256 = ? AND renderer = ? ORDER BY units', {
		replacements: [sha, RENDERER],
		type: QueryTypes.SELECT
	});
	return rows.map((r) => r.units);
}

beforeAll(async () => {
	await freshDatabase('reading_page');
	forgetShopSettings();
	[viewer, editor, moderator, admin] = await Promise.all([makeUser('viewer'), makeUser('editor'), makeUser('moderator'), makeUser('admin')]);
	const content = emptyContent({ make: 'Ostrel', model: 'Carrow', yearFrom: 2011, yearTo: 2016, body: 'wagon' });
	content.identity.notes = 'First notes: markerfirstnotes';
	// 254 mm is exactly 10 in (1 in = 25.4 mm, by definition since 1959).
	content.seats.spaces = [seatSpace('s1', 'driver', 254, 300, 100)];
	const made = await createVehicle(content, moderator);
	slug = made.slug;
	vehicleId = (await vehicleById((await view(viewer)).vehicle.id))!.id;
});
afterAll(async () => {
	await setReviewBeforeShow(false, admin);
	await closeDb();
});

describe('stored parts of a vehicle page', () => {
	it('are rendered in both unit systems when a revision is written', async () => {
		const { revision } = await view(viewer);
		expect(await keptUnits(revision.id)).toEqual(['metric', 'imperial']);
	});

	it('follow the reader’s unit system', async () => {
		const metric = await bodyText(viewer, 'metric');
		const imperial = await bodyText(viewer, 'imperial');
		expect(metric).toContain('254 mm');
		expect(metric).not.toContain('10.00 in');
		expect(imperial).toContain('10.00 in');
		expect(imperial).not.toContain('254 mm');
	});

	it('show a save to the next reader at once', async () => {
		await bodyText(viewer);
		const saved = await edit(editor, (c) => (c.identity.notes = 'Second notes: markersecondnotes'), 'Notes rewritten');
		const page = await view(viewer);
		expect(page.revision.id).toBe(saved);
		expect(JSON.stringify(page.body)).toContain('markersecondnotes');
		expect(JSON.stringify(page.body)).not.toContain('markerfirstnotes');
		expect(await keptUnits(saved)).toEqual(['metric', 'imperial']);
	});

	it('show a restore with the restored content, and never a hidden revision’s body', async () => {
		const secret = await edit(editor, (c) => (c.identity.notes = 'Customer phone markerhiddennotes'), 'Phone added');
		expect(await bodyText(viewer)).toContain('markerhiddennotes');
		const earlier = secret - 1;
		const restored = await restoreRevision(vehicleId, earlier, moderator);
		await setRevisionHidden(secret, true, 'customer details', moderator);
		for (const reader of [viewer, editor, moderator]) {
			const page = await view(reader);
			expect(page.revision.id).toBe(restored.revisionId);
			expect(JSON.stringify(page.body)).toContain('markersecondnotes');
			expect(JSON.stringify(page.body)).not.toContain('markerhiddennotes');
		}
	});

	it('give a viewer the signed-off body until a moderator signs the change off', async () => {
		await setReviewBeforeShow(true, admin);
		forgetShopSettings();
		const unsigned = await edit(editor, (c) => (c.identity.notes = 'Unchecked markerunsignednotes'), 'Unchecked notes');
		const forViewer = await view(viewer);
		expect(forViewer.newerAwaitingReview).toBe(true);
		expect(forViewer.revision.id).not.toBe(unsigned);
		expect(JSON.stringify(forViewer.body)).not.toContain('markerunsignednotes');
		expect(JSON.stringify((await view(editor)).body)).toContain('markerunsignednotes');

		await markReviewed(unsigned, moderator);
		const signed = await view(viewer);
		expect(signed.revision.id).toBe(unsigned);
		expect(signed.newerAwaitingReview).toBe(false);
		expect(JSON.stringify(signed.body)).toContain('markerunsignednotes');
		await setReviewBeforeShow(false, admin);
		forgetShopSettings();
	});

	it('give a full page view its body as fragments to splice, not as data', async () => {
		const locals = { user: viewer, units: 'metric' } as App.Locals;
		const page = await vehiclePageData({ locals, params: { slug }, url: new URL(`http://kickpanel.test/vehicles/${slug}`), isDataRequest: false });
		expect(page.body).toBeNull();
		expect(new TextDecoder().decode(locals.fragments?.['notes-identity'])).toContain('markerunsignednotes');
	});

	it('are rendered on the first view when missing (a new build) and stored for every later reader', async () => {
		const { revision } = await view(viewer);
		const sha = (await revisionById(revision.id))!.sha256;
		await db().query('DELETE FROM rendered_pages WHERE sha256 = ?', { replacements: [sha] });
		// A write elsewhere clears the page rows this process keeps.
		const other = await createVehicle(emptyContent({ make: 'Ostrel', model: 'Pellin', yearFrom: 2018, yearTo: 2022, body: 'sedan' }), moderator);
		expect(await bodyText(viewer, 'imperial')).toContain('10.00 in');
		expect(await keptUnits(revision.id)).toEqual(['imperial']);
		expect(other.slug).not.toBe(slug);
	});
});

describe('database work for a page view', () => {
	it('reads a page nobody opened since its last change in one query, and its trust marks in a second only when it has any', async () => {
		const other = await createVehicle(emptyContent({ make: 'Ostrel', model: 'Quarn', yearFrom: 2001, yearTo: 2005, body: 'coupe' }), moderator);
		// The shop settings and the reader's followed pages are read once per reader, not per page.
		await view(viewer);
		const queriesFor = async () => {
			const { result: page, sql: seen } = await statementsDuring(() => view(viewer, 'metric', other.slug));
			expect(page.vehicle.slug).toBe(other.slug);
			return { seen, trust: page.trust, id: page.vehicle.id };
		};
		const unmarked = await queriesFor();
		expect(unmarked.seen.length).toBe(1);
		expect(unmarked.seen[0]).toContain('rendered_pages');
		// It asks whether the page has marks at all.
		expect(unmarked.seen[0]).toContain('confirmations');
		expect(unmarked.trust.confirmations.installers).toBe(0);

		await confirmPage(unmarked.id, { note: 'Fitted as described.' }, viewer);
		const marked = await queriesFor();
		expect(marked.seen.length).toBe(2);
		expect(marked.seen[1]).toContain('confirmations');
		expect(marked.trust.confirmations).toMatchObject({ installers: 1, latest: { by: viewer.name, note: 'Fitted as described.' } });
	});

	it('shows the same trust marks as the trust service, and a new mark to the next view at once', async () => {
		const page = await createVehicle(emptyContent({ make: 'Ostrel', model: 'Tessin', yearFrom: 2009, yearTo: 2013, body: 'sedan' }), moderator);
		const id = (await view(viewer, 'metric', page.slug)).vehicle.id;
		await confirmPage(id, { note: 'Fitted as described.' }, viewer);
		await flagField(id, { fieldPath: null, note: 'Photos are of another trim.' }, editor);
		const shown = (await view(viewer, 'metric', page.slug)).trust;
		expect(shown.confirmations).toMatchObject({ installers: 1, onCurrentRevision: 1, latest: { note: 'Fitted as described.' } });
		expect(shown.openFlags.map((f) => f.note)).toEqual(['Photos are of another trim.']);
		// The trust service reads the marks on its own; both routes give the same summary.
		forgetTrustSummaries();
		expect(JSON.parse(JSON.stringify(await trustSummary(id, page.revisionId, 'metric')))).toEqual(JSON.parse(JSON.stringify(shown)));
	});

	it('forgets parts other builds stored long ago, and keeps this build’s and recent ones', async () => {
		const put = (renderer: string, daysAgo: number) =>
			db().query('INSERT INTO rendered_pages (sha256, units, renderer, parts, created_at) VALUES (?, ?, ?, ?, ?)', {
				replacements: [`${renderer}-${daysAgo}`.padEnd(64, '0'), 'metric', renderer, '{}', new Date(Date.now() - daysAgo * 86_400_000)]
			});
		await put('old-build', 3);
		await put('old-build', 2);
		await put('rolling-build', 0);
		await put(RENDERER, 5);
		expect(await forgetOtherBuilds(RENDERER, new Date(Date.now() - 86_400_000), 1)).toBe(2);
		const left = await db().query<{ renderer: string }>("SELECT renderer FROM rendered_pages WHERE renderer IN ('old-build', 'rolling-build', ?) AND parts = '{}' ORDER BY renderer", {
			replacements: [RENDERER],
			type: QueryTypes.SELECT
		});
		expect(left.map((r) => r.renderer).sort()).toEqual([RENDERER, 'rolling-build'].sort());
	});

	it('finds the stored parts by their primary key, joined on the revision digest', async () => {
		// MariaDB's EXPLAIN: a join between columns of different character sets cannot use the key and scans every stored part
		const plan = await db().query<{ table: string; type: string; key: string | null }>(`EXPLAIN ${PAGE_SQL}`, {
			replacements: ['metric', RENDERER, slug],
			type: QueryTypes.SELECT
		});
		const parts = plan.find((row) => row.table === 'rp');
		expect(parts?.key).toBe('PRIMARY');
		expect(['const', 'eq_ref']).toContain(parts?.type);
	});
});
