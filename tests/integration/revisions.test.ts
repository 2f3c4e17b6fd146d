import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { AuditLog, Revision, Vehicle, VehicleSlug } from '../../src/lib/server/db/models';
import { emptyContent, type VehicleContent } from '../../src/lib/domain/content/schema';
import {
	compareRevisions,
	createVehicle,
	listRevisions,
	restoreRevision,
	revisionById,
	saveRevision,
	setProtection,
	setRevisionHidden
} from '../../src/lib/server/services/revisions';
import { vehicleBySlug } from '../../src/lib/server/services/vehicles';
import { EditConflictError, NoChangeError, ServiceError } from '../../src/lib/server/errors';
import type { SessionUser } from '../../src/lib/domain/sessionUser';

let writer: SessionUser;
let moderator: SessionUser;
let viewer: SessionUser;
const remembered: Record<string, number> = {};

const sampleIdentity = { make: 'Tarnell', model: 'Brisk', yearFrom: 2010, yearTo: 2014, body: 'hatchback' as const };

function withSeat(content: VehicleContent, id: string, seat: 'driver' | 'passenger' | 'rear', heightMm: number): VehicleContent {
	const copy = structuredClone(content);
	copy.seats.spaces.push({ id, seat, lengthMm: 400, widthMm: 300, heightMm, obstacles: '', boardNeeded: false, travelNotes: '' });
	return copy;
}

beforeAll(async () => {
	await freshDatabase('revisions');
	writer = await makeUser('editor');
	moderator = await makeUser('moderator');
	viewer = await makeUser('viewer');
});
afterAll(() => closeDb());

async function page(slug: string) {
	const found = await vehicleBySlug(slug);
	if (!found || !('vehicle' in found)) throw new Error('no page');
	const rev = await revisionById(found.vehicle.latestRevisionId!);
	return { vehicle: found.vehicle, rev: rev! };
}

describe('saving revisions', () => {
	it('creates a page with a first revision and refuses a viewer', async () => {
		const created = await createVehicle(emptyContent(sampleIdentity), writer);
		expect(created.slug).toBe('tarnell-brisk-2010-2014-hatchback');
		const { rev } = await page(created.slug);
		expect(rev.parentId).toBeNull();
		expect(rev.sha256).toMatch(/^[0-9a-f]{64}$/);
		await expect(createVehicle(emptyContent({ ...sampleIdentity, model: 'Other' }), viewer)).rejects.toMatchObject({ status: 403 });
	});

	it('refuses a save identical to the latest as "no change"', async () => {
		const { vehicle, rev } = await page('tarnell-brisk-2010-2014-hatchback');
		await expect(saveRevision(vehicle.id, { baseRevisionId: rev.id, content: rev.content, summary: 'same' }, writer)).rejects.toThrow(NoChangeError);
	});

	it('answers invalid content with field errors and writes nothing', async () => {
		const { vehicle, rev } = await page('tarnell-brisk-2010-2014-hatchback');
		const before = await Revision.count();
		const bad = structuredClone(rev.content) as unknown as { seats: { spaces: unknown[] } };
		bad.seats.spaces.push({ id: 'x1', seat: 'passenger', lengthMm: -5, widthMm: 300, heightMm: 90, obstacles: '', boardNeeded: false, travelNotes: '' });
		const err = await saveRevision(vehicle.id, { baseRevisionId: rev.id, content: bad, summary: 'bad' }, writer).catch((e) => e);
		expect(err).toBeInstanceOf(ServiceError);
		expect(err.status).toBe(400);
		expect(Object.keys(err.fieldErrors)).toContain('seats.spaces.0.lengthMm');
		expect(await Revision.count()).toBe(before);
	});

	it('merges two edits of different fields made on the same base', async () => {
		const { vehicle, rev: base } = await page('tarnell-brisk-2010-2014-hatchback');
		const first = await saveRevision(vehicle.id, { baseRevisionId: base.id, content: withSeat(base.content, 'pass1', 'passenger', 95), summary: 'passenger seat' }, writer);
		expect(first.merged).toBe(false);
		remembered.seat95 = first.revisionId;
		const second = structuredClone(base.content);
		second.dash.kit = 'Sample double-DIN kit';
		const result = await saveRevision(vehicle.id, { baseRevisionId: base.id, content: second, summary: 'dash kit' }, writer);
		expect(result.merged).toBe(true);
		const latest = await revisionById(result.revisionId);
		expect(latest!.content.dash.kit).toBe('Sample double-DIN kit');
		expect(latest!.content.seats.spaces.map((s) => s.heightMm)).toEqual([95]);
		expect(latest!.parentId).toBe(first.revisionId);
	});

	it('answers a same-field clash with the conflict and all three values', async () => {
		const { vehicle, rev: base } = await page('tarnell-brisk-2010-2014-hatchback');
		const theirs = structuredClone(base.content);
		theirs.seats.spaces[0].heightMm = 88;
		remembered.seat88 = (await saveRevision(vehicle.id, { baseRevisionId: base.id, content: theirs, summary: 'measured again' }, writer)).revisionId;
		const yours = structuredClone(base.content);
		yours.seats.spaces[0].heightMm = 91;
		const err = await saveRevision(vehicle.id, { baseRevisionId: base.id, content: yours, summary: 'my reading' }, writer).catch((e) => e);
		expect(err).toBeInstanceOf(EditConflictError);
		expect(err.status).toBe(409);
		expect(err.conflicts).toEqual([expect.objectContaining({ base: 95, theirs: 88, yours: 91 })]);
	});

	it('keeps every one of 20 racing saves: merged or refused, never lost, one straight parent chain', async () => {
		const created = await createVehicle(emptyContent({ ...sampleIdentity, model: 'Racer' }), writer);
		const { vehicle, rev: base } = await page(created.slug);
		// Ten writers each add their own seat (disjoint, must all merge); ten more all change the dash kit (clash).
		const attempts = Array.from({ length: 20 }, (_, i) => {
			const content = i < 10 ? withSeat(base.content, `seat${i}`, 'rear', 100 + i) : { ...structuredClone(base.content), dash: { ...base.content.dash, kit: `Kit ${i}` } };
			return saveRevision(vehicle.id, { baseRevisionId: base.id, content, summary: `race ${i}` }, writer).then(
				(r) => ({ ok: true as const, i, r }),
				(e) => ({ ok: false as const, i, e })
			);
		});
		const outcomes = await Promise.all(attempts);
		for (const o of outcomes) {
			if (!o.ok) expect(o.e).toBeInstanceOf(EditConflictError);
		}
		const saved = outcomes.filter((o) => o.ok);
		const { rev: latest } = await page(created.slug);
		// Every disjoint seat landed.
		expect(latest.content.seats.spaces.map((s) => s.id).sort()).toEqual(Array.from({ length: 10 }, (_, i) => `seat${i}`).sort());
		// Exactly one kit edit can win on this base; the other nine were told about the clash.
		expect(saved.filter((o) => o.i >= 10)).toHaveLength(1);
		expect(saved).toHaveLength(11);
		const chain = await Revision.findAll({ where: { vehicleId: vehicle.id }, order: [['id', 'ASC']] });
		expect(chain).toHaveLength(12);
		for (let k = 1; k < chain.length; k++) expect(Number(chain[k].parentId)).toBe(Number(chain[k - 1].id));
	});
});

describe('moderation', () => {
	it('restores an old revision as a new one with an automatic summary and an audit entry', async () => {
		const { vehicle } = await page('tarnell-brisk-2010-2014-hatchback');
		const history = await listRevisions(viewer, { vehicleId: vehicle.id });
		const oldest = history.items[history.items.length - 1];
		await expect(restoreRevision(vehicle.id, oldest.id, writer)).rejects.toMatchObject({ status: 403 });
		const restored = await restoreRevision(vehicle.id, oldest.id, moderator);
		const rev = await revisionById(restored.revisionId);
		expect(rev!.restoresRevisionId).toBe(oldest.id);
		expect(rev!.summary).toMatch(new RegExp(`^Restored revision ${oldest.id} by `));
		expect(rev!.content.seats.spaces).toEqual([]);
		expect(await AuditLog.count({ where: { action: 'revision.restore' } })).toBe(1);
	});

	it('hides an old revision (flag, not delete) and refuses to hide the current one', async () => {
		const { vehicle, rev: latest } = await page('tarnell-brisk-2010-2014-hatchback');
		await expect(setRevisionHidden(latest.id, true, 'test', moderator)).rejects.toMatchObject({ status: 409 });
		const target = latest.parentId!;
		await setRevisionHidden(target, true, 'customer phone number in notes', moderator);
		const history = await listRevisions(viewer, { vehicleId: vehicle.id });
		expect(history.items.find((i) => i.id === target)).toMatchObject({ hidden: true, summary: '' });
		await expect(compareRevisions(vehicle.id, target, latest.id, viewer, 'metric')).rejects.toMatchObject({ status: 403 });
		expect(await Revision.findByPk(target)).not.toBeNull();
	});

	it('protects a page so only moderators can edit it', async () => {
		const { vehicle, rev } = await page('tarnell-brisk-2010-2014-hatchback');
		await setProtection(vehicle.id, 'moderators', moderator);
		const edit = structuredClone(rev.content);
		edit.dash.kit = 'Writer change';
		await expect(saveRevision(vehicle.id, { baseRevisionId: rev.id, content: edit, summary: 'x' }, writer)).rejects.toMatchObject({ status: 403 });
		await expect(saveRevision(vehicle.id, { baseRevisionId: rev.id, content: edit, summary: 'x' }, moderator)).resolves.toMatchObject({ merged: false });
		expect(await AuditLog.count({ where: { action: 'vehicle.protect' } })).toBe(1);
	});

	it('moves the slug when identity changes and keeps the old one as a redirect', async () => {
		const { vehicle, rev } = await page('tarnell-brisk-2010-2014-hatchback');
		const edit = structuredClone(rev.content);
		edit.identity.yearTo = 2015;
		const saved = await saveRevision(vehicle.id, { baseRevisionId: rev.id, content: edit, summary: 'one more model year' }, moderator);
		expect(saved.slug).toBe('tarnell-brisk-2010-2015-hatchback');
		expect((await Vehicle.findByPk(vehicle.id))!.slug).toBe(saved.slug);
		expect(await vehicleBySlug('tarnell-brisk-2010-2014-hatchback')).toEqual({ redirectTo: 'tarnell-brisk-2010-2015-hatchback' });
		expect(await VehicleSlug.count()).toBe(1);
	});

	it('compares two revisions field by field in the trade\'s words', async () => {
		const { vehicle } = await page('tarnell-brisk-2010-2015-hatchback');
		// The later revision was hidden above, so only a moderator may compare it.
		const cmp = await compareRevisions(vehicle.id, remembered.seat95, remembered.seat88, moderator, 'metric');
		// Between them: the height re-measured, and the dash kit merged in from the other writer.
		expect(cmp.changes).toEqual([
			expect.objectContaining({ label: 'Passenger seat space, height', before: '95 mm', after: '88 mm' }),
			expect.objectContaining({ path: 'dash.kit', after: 'Sample double-DIN kit' })
		]);
	});
});
