import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { db } from '../../src/lib/server/db';
import { emptyContent, type VehicleContent } from '../../src/lib/domain/content/schema';
import { createVehicle, listRevisions, restoreRevision, revisionById, saveRevision, setRevisionHidden, type StoredRevision } from '../../src/lib/server/services/revisions';
import { measurementOrigins, placeReaders } from '../../src/lib/server/services/evidence';
import { requireVehicle } from '../../src/lib/server/services/vehicles';
import { NOTES_RENDERER_VERSION } from '../../src/lib/server/services/rendering';
import * as revisionOrigins from '../../src/lib/server/db/migrations/2026-12-05T02-00-00_revision_origins';
import type { SessionUser } from '../../src/lib/domain/sessionUser';

// Invented makes, models and measurements (sample data only).
let alice: SessionUser;
let bob: SessionUser;
let carol: SessionUser;
let moderator: SessionUser;

beforeAll(async () => {
	await freshDatabase('origins');
	alice = await makeUser('editor', 'Alice Fitter');
	bob = await makeUser('editor', 'Bob Fitter');
	carol = await makeUser('editor', 'Carol Fitter');
	moderator = await makeUser('moderator', 'Mona Moderator');
});
afterAll(() => closeDb());

function firstContent(model: string): VehicleContent {
	const c = emptyContent({ make: 'Ostrel', model, yearFrom: 2014, yearTo: 2019, body: 'wagon' });
	c.seats.spaces = [
		{ id: 'drv', seat: 'driver', lengthMm: 420, widthMm: 310, heightMm: 85, obstacles: '', boardNeeded: false, travelNotes: '' },
		{ id: 'pas', seat: 'passenger', lengthMm: 410, widthMm: 300, heightMm: 90, obstacles: '', boardNeeded: false, travelNotes: '' }
	];
	c.dash.opening = 'double-din';
	c.dash.depthMm = 160;
	c.speakers.locations = [{ id: 'fd', location: 'front door', nominalSize: '6.5 in', cutoutMm: 142, depthMm: 60, impedanceOhm: 4, grille: '' }];
	c.firewall.passages = [{ id: 'main', location: 'behind the clutch pedal', kind: 'factory-grommet', pushFrom: 'cabin', holeMm: 20, avoid: '', tools: '' }];
	c.removal.notes = 'Two clips behind the **glovebox**.';
	return c;
}

async function save(revisionId: number, author: SessionUser, edit: (c: VehicleContent) => void): Promise<number> {
	const rev = (await revisionById(revisionId))!;
	const content = structuredClone(rev.content);
	edit(content);
	return (await saveRevision(rev.vehicleId, { baseRevisionId: rev.id, content, summary: 'edit' }, author)).revisionId;
}

async function origins(revisionId: number): Promise<Record<string, number>> {
	const rows = await db().query<{ part: string; origin: number | string }>(
		'SELECT part, origin_revision_id AS origin FROM revision_origins WHERE revision_id = ?',
		{ replacements: [revisionId], type: QueryTypes.SELECT }
	);
	return Object.fromEntries(rows.map((r) => [r.part, Number(r.origin)]));
}

async function evidence(slug: string) {
	const vehicle = await requireVehicle(slug);
	const rev = (await revisionById(vehicle.latestRevisionId!))!;
	return measurementOrigins(rev, placeReaders(rev.content));
}

describe('origins recorded with each revision', () => {
	it('keeps an unchanged part’s origin and moves a changed one to the new revision', async () => {
		const r1 = (await createVehicle(firstContent('Lumen'), alice)).revisionId;
		const r2 = await save(r1, bob, (c) => (c.removal.notes += '\n\nA third clip on later cars.'));
		const r3 = await save(r2, carol, (c) => (c.seats.spaces[1].heightMm = 95));
		// Worded, not measured: the seat's figures stay Alice's, the seats section moves.
		const r4 = await save(r3, bob, (c) => (c.seats.spaces[0].obstacles = 'Loom clipped to the floor'));
		const rows = await origins(r4);
		expect(rows).toMatchObject({
			'section:identity': r1,
			'section:removal': r2,
			'section:seats': r4,
			'section:dash': r1,
			'seat:drv': r1,
			'seat:pas': r3,
			dash: r1,
			'speaker:fd': r1,
			'passage:main': r1
		});
		const e = await evidence('ostrel-lumen-2014-2019-wagon');
		expect(e['seat:drv']).toMatchObject({ measuredInRevisionId: r1, measuredBy: 'Alice Fitter', changedBy: 'Bob Fitter', revisionId: r4, orAtLeastSince: false });
		expect(e['seat:pas']).toMatchObject({ measuredInRevisionId: r3, measuredBy: 'Carol Fitter' });
		expect(e.dash).toMatchObject({ measuredInRevisionId: r1, measuredBy: 'Alice Fitter' });
		expect(e['speaker:fd']).toMatchObject({ measuredInRevisionId: r1 });
	});

	it('starts a removed and re-added place afresh, and a new place in its own revision', async () => {
		const r1 = (await createVehicle(firstContent('Brae'), alice)).revisionId;
		const r2 = await save(r1, bob, (c) => (c.speakers.locations = []));
		const r3 = await save(r2, carol, (c) => {
			c.speakers.locations = [{ id: 'fd', location: 'front door', nominalSize: '6.5 in', cutoutMm: 142, depthMm: 60, impedanceOhm: 4, grille: '' }];
			c.power.runs = [{ id: 'amp', to: 'boot', lengthM: 5.2 }];
		});
		expect((await origins(r2))['speaker:fd']).toBeUndefined();
		expect(await origins(r3)).toMatchObject({ 'speaker:fd': r3, 'run:amp': r3, 'seat:drv': r1, 'section:speakers': r3, 'section:power': r3 });
	});
});

describe('hidden revisions', () => {
	it('never names a hidden author: the credit passes to the next visible revision with the same figures', async () => {
		const r1 = (await createVehicle(firstContent('Corvo'), alice)).revisionId;
		const r2 = await save(r1, bob, (c) => (c.seats.spaces[0].heightMm = 70));
		const r3 = await save(r2, carol, (c) => (c.removal.notes = 'Three clips.'));
		await setRevisionHidden(r2, true, 'wrong figures', moderator);
		const e = await evidence('ostrel-corvo-2014-2019-wagon');
		// Visible history: r1 (85 mm), r3 (70 mm). The figures first appear, visibly, in r3.
		expect(e['seat:drv']).toMatchObject({ measuredInRevisionId: r3, measuredBy: 'Carol Fitter' });
		expect(e['seat:pas']).toMatchObject({ measuredInRevisionId: r1, measuredBy: 'Alice Fitter' });
		await setRevisionHidden(r2, false, 'figures were right', moderator);
		expect((await evidence('ostrel-corvo-2014-2019-wagon'))['seat:drv']).toMatchObject({ measuredInRevisionId: r2, measuredBy: 'Bob Fitter' });
	});

	it('keeps the first measurer when a hidden edit changed the figures and a restore put them back', async () => {
		const r1 = (await createVehicle(firstContent('Dune'), alice)).revisionId;
		const r2 = await save(r1, carol, (c) => (c.removal.notes = 'Clips only.'));
		const r3 = await save(r2, bob, (c) => {
			c.seats.spaces[0].heightMm = 999;
			c.dash.depthMm = 20;
		});
		const r4 = (await restoreRevision((await revisionById(r3))!.vehicleId, r2, moderator)).revisionId;
		// Before hiding, the restore re-entered the figures after Bob's change, as any edit would.
		expect(await origins(r4)).toMatchObject({ 'seat:drv': r4, dash: r4, 'seat:pas': r1, 'section:removal': r2, 'section:seats': r4 });
		expect((await evidence('ostrel-dune-2014-2019-wagon'))['seat:drv']).toMatchObject({ measuredInRevisionId: r4, measuredBy: 'Mona Moderator' });
		await setRevisionHidden(r3, true, 'vandalism', moderator);
		const e = await evidence('ostrel-dune-2014-2019-wagon');
		// Visible history r1, r2, r4 all carry Alice's figures.
		expect(e['seat:drv']).toMatchObject({ measuredInRevisionId: r1, measuredBy: 'Alice Fitter', changedBy: 'Mona Moderator', revisionId: r4 });
		expect(e.dash).toMatchObject({ measuredInRevisionId: r1, measuredBy: 'Alice Fitter' });
	});

	it('agrees with a plain walk over the visible history after every step of a long random one', async () => {
		const r1 = (await createVehicle(firstContent('Eske'), alice)).revisionId;
		const authors = [alice, bob, carol];
		let seed = 7;
		const next = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
		const ids = [r1];
		const hidden = new Set<number>();
		// The figures each key stands for, read here independently of the code under test.
		const figures: Record<string, (c: VehicleContent) => unknown> = {
			'seat:drv': (c) => c.seats.spaces.filter((s) => s.id === 'drv').map((s) => [s.seat, s.lengthMm, s.widthMm, s.heightMm]),
			'seat:pas': (c) => c.seats.spaces.filter((s) => s.id === 'pas').map((s) => [s.seat, s.lengthMm, s.widthMm, s.heightMm]),
			dash: (c) => [c.dash.opening, c.dash.depthMm],
			'speaker:fd': (c) => c.speakers.locations.filter((l) => l.id === 'fd').map((l) => [l.cutoutMm, l.depthMm])
		};
		let crossedHidden = 0;
		for (let i = 1; i < 60; i++) {
			const latest = ids[ids.length - 1];
			const roll = next();
			if (roll < 0.15 && ids.length > 3) {
				const target = ids[Math.floor(next() * (ids.length - 1))];
				const [t, l] = [(await revisionById(target))!, (await revisionById(latest))!];
				if (!hidden.has(target) && t.sha256 !== l.sha256) ids.push((await restoreRevision(t.vehicleId, target, moderator)).revisionId);
			} else if (roll > 0.85) {
				// Wrong figures entered, put back by a restore, then hidden.
				const bad = await save(latest, authors[i % 3], (c) => {
					c.seats.spaces[0].heightMm = 999;
					c.dash.depthMm = 20;
				});
				ids.push(bad, (await restoreRevision((await revisionById(latest))!.vehicleId, latest, moderator)).revisionId);
				await setRevisionHidden(bad, true, 'wrong figures', moderator);
				hidden.add(bad);
			} else {
				// Few distinct values, so figures often come back to earlier ones.
				ids.push(
					await save(latest, authors[i % 3], (c) => {
						c.removal.notes = `Pass ${i}.`;
						if (roll < 0.5) c.seats.spaces[0].heightMm = 80 + Math.floor(next() * 2);
						else if (roll < 0.6) c.seats.spaces[1].lengthMm = 410 + Math.floor(next() * 2);
						else if (roll < 0.75) c.dash.depthMm = 150 + Math.floor(next() * 2);
					})
				);
			}
			if (next() < 0.35) {
				const victim = ids[Math.floor(next() * (ids.length - 1))];
				const hide = next() < 0.85;
				await setRevisionHidden(victim, hide, 'random moderation', moderator);
				if (hide) hidden.add(victim);
				else hidden.delete(victim);
			}
			const e = await evidence('ostrel-eske-2014-2019-wagon');
			const visible: StoredRevision[] = [];
			for (const id of [...ids].reverse()) if (!hidden.has(id)) visible.push((await revisionById(id))!);
			// From the newest visible revision back, while the figures stay equal.
			for (const [key, read] of Object.entries(figures)) {
				const now = JSON.stringify(read(visible[0].content));
				let credited = visible[0];
				for (const rev of visible) {
					if (JSON.stringify(read(rev.content)) !== now) break;
					credited = rev;
				}
				expect(e[key], `${key} after step ${i}`).toMatchObject({ measuredInRevisionId: credited.id, measuredBy: credited.authorName });
				const between = ids.filter((h) => hidden.has(h) && h > credited.id && h < visible[0].id);
				for (const h of between) if (JSON.stringify(read((await revisionById(h))!.content)) !== now) crossedHidden++;
			}
		}
		// The history really did hide changed figures inside credited runs.
		expect(crossedHidden).toBeGreaterThan(10);
	});
});

describe('restores and rendered notes', () => {
	it('shares the restored revision’s rendered notes instead of storing them again', async () => {
		const r1 = (await createVehicle(firstContent('Fjell'), alice)).revisionId;
		const r2 = await save(r1, bob, (c) => (c.removal.notes = 'Pull the *ashtray* first.'));
		const count = async () =>
			Number((await db().query<{ n: number }>('SELECT COUNT(*) AS n FROM rendered_notes', { type: QueryTypes.SELECT }))[0].n);
		const before = await count();
		const r3 = (await restoreRevision((await revisionById(r2))!.vehicleId, r1, moderator)).revisionId;
		expect(await count()).toBe(before);
		const [first, restored] = [(await revisionById(r1))!, (await revisionById(r3))!];
		expect(restored.sha256).toBe(first.sha256);
		expect(restored.rendered).toEqual(first.rendered);
		// CommonMark spec, "Emphasis and strong emphasis": **text** is <strong>, a paragraph is <p>…</p>.
		expect(restored.rendered.removal).toBe('<p>Two clips behind the <strong>glovebox</strong>.</p>\n');
		const stored = await db().query<{ rendered: string }>('SELECT rendered FROM revisions WHERE id = ?', { replacements: [r3], type: QueryTypes.SELECT });
		expect(stored[0].rendered).toBe('');
	});

	it('renders again, and keeps, notes a renderer version has not made yet', async () => {
		const r1 = (await createVehicle(firstContent('Grind'), alice)).revisionId;
		const rev = (await revisionById(r1))!;
		// As if these were made by an older renderer.
		await db().query('UPDATE rendered_notes SET renderer_version = ?, notes = ? WHERE sha256 = ?', {
			replacements: [NOTES_RENDERER_VERSION - 1, JSON.stringify({ removal: '<p>stale</p>' }), rev.sha256]
		});
		const fresh = (await db().transaction((t) => revisionById(r1, t)))!;
		expect(fresh.rendered.removal).toBe('<p>Two clips behind the <strong>glovebox</strong>.</p>\n');
		const kept = await db().query<{ v: number }>('SELECT renderer_version AS v FROM rendered_notes WHERE sha256 = ? ORDER BY v', {
			replacements: [rev.sha256],
			type: QueryTypes.SELECT
		});
		expect(kept.map((k) => Number(k.v))).toEqual([NOTES_RENDERER_VERSION - 1, NOTES_RENDERER_VERSION]);
	});
});

describe('listing by section', () => {
	it('lists exactly the revisions whose changes touch the section', async () => {
		const r1 = (await createVehicle(firstContent('Harl'), alice)).revisionId;
		const r2 = await save(r1, bob, (c) => (c.removal.notes = 'No clips at all.'));
		const r3 = await save(r2, carol, (c) => (c.seats.spaces[0].lengthMm = 430));
		const r4 = await save(r3, bob, (c) => {
			c.dash.kit = 'Two-piece trim';
			c.seats.notes = 'Carpet is thick here.';
		});
		const vehicleId = (await revisionById(r1))!.vehicleId;
		const ids = async (section: 'seats' | 'removal' | 'dash' | 'camera') =>
			(await listRevisions(null, { vehicleId, section })).items.map((i) => i.id);
		expect(await ids('seats')).toEqual([r4, r3, r1]);
		expect(await ids('removal')).toEqual([r2, r1]);
		expect(await ids('dash')).toEqual([r4, r1]);
		expect(await ids('camera')).toEqual([r1]);
		const listed = await listRevisions(null, { vehicleId, section: 'seats' });
		expect(listed.total).toBe(3);
		expect(listed.items.every((i) => i.sections.includes('seats'))).toBe(true);
	});
});

describe('the back-fill', () => {
	it('records older revisions exactly as their saves did', async () => {
		const all = async () =>
			db().query<{ revisionId: number; part: string; origin: number; digest: string | null }>(
				'SELECT revision_id AS revisionId, part, origin_revision_id AS origin, digest FROM revision_origins ORDER BY revision_id, part',
				{ type: QueryTypes.SELECT }
			);
		const written = await all();
		expect(written.length).toBeGreaterThan(100);
		const q = db().getQueryInterface();
		await revisionOrigins.down({ context: q, name: revisionOrigins.name });
		await revisionOrigins.up({ context: q, name: revisionOrigins.name });
		expect(await all()).toEqual(written);
	});
});
