import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { emptyContent, type SeatSpace, type VehicleContent } from '../../src/lib/domain/content/schema';
import { seatSpace as seat } from '../helpers/places';
import { fitVerdict, type Box } from '../../src/lib/domain/fit';
import type { Part } from '../../src/lib/domain/part';
import { createVehicle, revisionById, saveRevision } from '../../src/lib/server/services/revisions';
import { requireVehicle } from '../../src/lib/server/services/vehicles';
import { createPart } from '../../src/lib/server/services/parts';
import { checkVehicleFit, vehiclesForBox, vehiclesForPart } from '../../src/lib/server/services/fit';
import { seatSpaceIndex, warmSeatSpaceIndex } from '../../src/lib/server/fit';
import { confirmPage, flaggableFields, flagField, trustSummary } from '../../src/lib/server/services/trust';
import { Confirmation } from '../../src/lib/server/db/models';
import type { SessionUser } from '../../src/lib/domain/sessionUser';

// Invented makes, models and measurements (sample data only).
let writer: SessionUser;
let secondWriter: SessionUser;
let moderator: SessionUser;
let viewer: SessionUser;
let secondViewer: SessionUser;
let amp: Part;
let headUnit: Part;
let speaker: Part;

function page(model: string, spaces: SeatSpace[], extra: (c: VehicleContent) => void = () => {}): VehicleContent {
	const c = emptyContent({ make: 'Quillan', model, yearFrom: 2011, yearTo: 2015, body: 'sedan' });
	c.seats.spaces = spaces;
	extra(c);
	return c;
}

async function latest(slug: string) {
	const v = await requireVehicle(slug);
	return { vehicle: v, rev: (await revisionById(v.latestRevisionId!))! };
}

const trustOf = async (slug: string) => {
	const { vehicle } = await latest(slug);
	return trustSummary(vehicle.id, vehicle.latestRevisionId);
};

let tarrow = '';
let pimm = '';

beforeAll(async () => {
	await freshDatabase('fit');
	writer = await makeUser('editor', 'Writer One');
	secondWriter = await makeUser('editor', 'Writer Two');
	moderator = await makeUser('moderator');
	viewer = await makeUser('viewer', 'Installer One');
	secondViewer = await makeUser('viewer', 'Installer Two');
	// A 300 × 200 × 50 mm box: the worked cases below are by hand with the default 10 mm clearance.
	amp = await createPart({ kind: 'amplifier', sku: 'T-AMP', name: 'Test amp', lengthMm: 300, widthMm: 200, heightMm: 50, channels: 2, rmsWattsPerChannel: 100, ampClass: 'D' }, moderator);
	headUnit = await createPart({ kind: 'head-unit', sku: 'T-HU', name: 'Test double DIN', dinSize: 2, chassisDepthMm: 150 }, moderator);
	speaker = await createPart({ kind: 'speaker', sku: 'T-SPK', name: 'Test 6.5', cutoutMm: 142, mountingDepthMm: 58, impedanceOhm: 4 }, moderator);
	tarrow = (
		await createVehicle(
			page(
				'Tarrow',
				[
					seat('drv', 'driver', 310, 210, 60), // exact after clearance: tight, 0 mm
					seat('pas', 'passenger', 270, 420, 100), // only turned: 270 − 210 = 60, 420 − 310 = 110, 100 − 60 = 40
					seat('rea', 'rear', 400, 300, 59) // 59 − 60 = −1 mm
				],
				(c) => {
					c.dash.opening = 'double-din';
					c.dash.depthMm = 225; // 225 − 150 − 50 for plugs = 25 mm
					c.speakers.locations = [
						{ id: 'fd', location: 'Front door', nominalSize: '6.5 in', cutoutMm: 145, depthMm: 70, impedanceOhm: 4, grille: '' },
						{ id: 'rd', location: 'Rear door', nominalSize: '5.25 in', cutoutMm: 118, depthMm: 50, impedanceOhm: 4, grille: '' }
					];
				}
			),
			writer
		)
	).slug;
	pimm = (await createVehicle(page('Pimm', [seat('p1', 'passenger', 500, 400, null), seat('d1', 'driver', 520, 420, 120)]), writer)).slug;
});
afterAll(() => closeDb());

describe('a part against one page', () => {
	it('calls an exact fit after clearance tight, with zero margins', async () => {
		const a = await checkVehicleFit({ vehicle: tarrow, partId: amp.id, seat: 'driver' }, viewer);
		expect(a.check).toBe('seat');
		if (a.check !== 'seat') return;
		expect(a.chosen?.result).toEqual({ verdict: 'tight', rotated: false, margins: { l: 0, w: 0, h: 0 }, limiting: 'l' });
		expect(a.spaces.map((s) => s.result.verdict)).toEqual(['tight', 'fits', 'no-fit']);
	});

	it('fits only turned under the passenger seat', async () => {
		const a = await checkVehicleFit({ vehicle: tarrow, partId: amp.id, seat: 'pas' }, viewer);
		if (a.check !== 'seat') throw new Error('seat check expected');
		expect(a.chosen?.result).toEqual({ verdict: 'fits', rotated: true, margins: { l: 60, w: 110, h: 40 }, limiting: 'h' });
	});

	it('is no-fit 1 mm over, naming height', async () => {
		const a = await checkVehicleFit({ vehicle: tarrow, partId: amp.id, seat: 'rear' }, viewer);
		if (a.check !== 'seat') throw new Error('seat check expected');
		expect(a.chosen?.result).toMatchObject({ verdict: 'no-fit', limiting: 'h', margins: { h: -1 } });
	});

	it('says not measured where a dimension is missing, and picks the best seat when none is asked for', async () => {
		const a = await checkVehicleFit({ vehicle: pimm, box: { l: 300, w: 200, h: 50 }, seat: 'passenger' }, viewer);
		if (a.check !== 'seat') throw new Error('seat check expected');
		expect(a.chosen?.result.verdict).toBe('not-measured');
		const best = await checkVehicleFit({ vehicle: pimm, box: { l: 300, w: 200, h: 50 } }, viewer);
		if (best.check !== 'seat') throw new Error('seat check expected');
		expect(best.chosen?.spaceId).toBe('d1');
	});

	it('checks a head unit against the dash and a speaker against its location', async () => {
		const dash = await checkVehicleFit({ vehicle: tarrow, partId: headUnit.id }, viewer);
		expect(dash).toMatchObject({ check: 'dash', result: { verdict: 'fits', depthMarginMm: 25, needsKit: false } });
		const spk = await checkVehicleFit({ vehicle: tarrow, partId: speaker.id, location: 'rd' }, viewer);
		// 118 − 142 = −24 mm on the cut-out
		expect(spk).toMatchObject({ check: 'speaker', chosen: { locationId: 'rd', result: { verdict: 'no-fit', limiting: 'cutout' } } });
		const best = await checkVehicleFit({ vehicle: tarrow, partId: speaker.id }, viewer);
		// 145 − 142 = 3 mm on the cut-out: tight under the 5 mm speaker threshold
		expect(best).toMatchObject({ check: 'speaker', chosen: { locationId: 'fd', result: { verdict: 'tight', margins: { cutout: 3, depth: 12 } } } });
	});

	it('refuses a seat the page does not record and a missing part or box', async () => {
		await expect(checkVehicleFit({ vehicle: pimm, partId: amp.id, seat: 'rear' }, viewer)).rejects.toMatchObject({ status: 400 });
		await expect(checkVehicleFit({ vehicle: pimm }, viewer)).rejects.toMatchObject({ status: 400 });
		await expect(checkVehicleFit({ vehicle: 'no-such-page', partId: amp.id }, viewer)).rejects.toMatchObject({ status: 404 });
		await expect(checkVehicleFit({ vehicle: pimm, partId: 999_999 }, viewer)).rejects.toMatchObject({ status: 404 });
	});

	it('names who entered the figures and in which revision', async () => {
		const { vehicle, rev } = await latest(tarrow);
		const content = structuredClone(rev.content);
		content.seats.spaces[1].heightMm = 105;
		await saveRevision(vehicle.id, { baseRevisionId: rev.id, content, summary: 'passenger seat re-measured' }, secondWriter);
		const driver = await checkVehicleFit({ vehicle: tarrow, partId: amp.id, seat: 'driver' }, viewer);
		const passenger = await checkVehicleFit({ vehicle: tarrow, partId: amp.id, seat: 'passenger' }, viewer);
		expect(driver.evidence).toMatchObject({ measuredBy: 'Writer One', measuredInRevisionId: rev.id, changedBy: 'Writer Two' });
		expect(passenger.evidence).toMatchObject({ measuredBy: 'Writer Two', changedBy: 'Writer Two' });
		expect(passenger.evidence!.measuredInRevisionId).toBeGreaterThan(rev.id);
	});
});

/** Every recorded seat space on every page, straight from the latest revisions. */
async function allSpaces() {
	const out: { slug: string; id: string; seat: string; space: { l: number | null; w: number | null; h: number | null } }[] = [];
	for (const slug of [tarrow, pimm, ...extraSlugs]) {
		const { rev } = await latest(slug);
		for (const s of rev.content.seats.spaces) out.push({ slug, id: s.id, seat: s.seat, space: { l: s.lengthMm, w: s.widthMm, h: s.heightMm } });
	}
	return out;
}
const extraSlugs: string[] = [];

async function expectReverseMatchesFitVerdict(box: Box) {
	const answer = await vehiclesForBox(box);
	const byPlace = new Map(answer.matches.map((m) => [`${m.vehicleSlug}/${m.placeId}`, m]));
	const spaces = await allSpaces();
	for (const s of spaces) {
		const r = fitVerdict(box, s.space);
		const row = byPlace.get(`${s.slug}/${s.id}`);
		if (r.verdict === 'fits' || r.verdict === 'tight') {
			expect(row, `${s.slug} ${s.seat}`).toBeDefined();
			expect(row).toMatchObject({ verdict: r.verdict, rotated: r.rotated, limiting: r.limiting, seat: s.seat });
			for (const axis of ['l', 'w', 'h'] as const) expect(row!.margins[axis]).toBeCloseTo(r.margins[axis], 3);
		} else {
			expect(row, `${s.slug} ${s.seat} is ${r.verdict}`).toBeUndefined();
		}
		if (r.verdict === 'not-measured') expect(answer.notMeasured).toContainEqual(expect.objectContaining({ vehicleSlug: s.slug, placeId: s.id }));
	}
	expect(answer.searched.places).toBe(spaces.length);
}

describe('which vehicles does this part fit', () => {
	it('answers with slug, title, seat, verdict and margins', async () => {
		await warmSeatSpaceIndex();
		const answer = await vehiclesForPart(amp);
		expect(answer.check).toBe('seat');
		const tarrowRows = answer.matches.filter((m) => m.vehicleSlug === tarrow);
		expect(tarrowRows.map((m) => [m.seat, m.verdict, m.rotated])).toEqual([
			['driver', 'tight', false],
			['passenger', 'fits', true]
		]);
		expect(tarrowRows[0]).toMatchObject({ vehicleTitle: 'Quillan Tarrow 2011–2015', margins: { l: 0, w: 0, h: 0 }, limiting: 'l' });
		expect(answer.notMeasured).toEqual([expect.objectContaining({ vehicleSlug: pimm, seat: 'passenger' })]);
	});

	it('agrees with fitVerdict for every row', async () => {
		await expectReverseMatchesFitVerdict({ l: 300, w: 200, h: 50 });
		await expectReverseMatchesFitVerdict({ l: 400, w: 350, h: 30 });
	});

	it('follows saved revisions and new pages without a restart', async () => {
		const { vehicle, rev } = await latest(tarrow);
		const content = structuredClone(rev.content);
		content.seats.spaces[2].heightMm = 80; // rear: 80 − 60 = 20 mm, now fits
		await saveRevision(vehicle.id, { baseRevisionId: rev.id, content, summary: 'rear seat re-measured' }, writer);
		let rows = (await vehiclesForPart(amp)).matches.filter((m) => m.vehicleSlug === tarrow);
		expect(rows.map((m) => m.seat)).toEqual(['driver', 'passenger', 'rear']);

		// A page with a different set of seats: the index is rebuilt, not patched.
		const added = await createVehicle(page('Orrin', [seat('o1', 'rear', 700, 500, 200)]), writer);
		extraSlugs.push(added.slug);
		rows = (await vehiclesForPart(amp)).matches.filter((m) => m.vehicleSlug === added.slug);
		expect(rows).toEqual([expect.objectContaining({ seat: 'rear', verdict: 'fits' })]);
		const { index } = await seatSpaceIndex();
		expect(index.size).toBe(6);
		await expectReverseMatchesFitVerdict({ l: 300, w: 200, h: 50 });
	});

	it('agrees with fitVerdict on figures typed in inches, where single precision would round', async () => {
		// 12 × 8 × 2 in = 304.8 × 203.2 × 50.8 mm (international inch, exact by definition); 304.8 is not exact in float32
		const added = await createVehicle(page('Inchley', [seat('i1', 'driver', 304.8, 203.2, 50.8)]), writer);
		extraSlugs.push(added.slug);
		// by hand: 304.8 − (294.8 + 10) = 0 on every axis, an exact fit, so tight
		const box = { l: 294.8, w: 193.2, h: 40.8 };
		const row = (await vehiclesForBox(box)).matches.find((m) => m.vehicleSlug === added.slug);
		expect(row).toMatchObject({ verdict: 'tight', seat: 'driver' });
		await expectReverseMatchesFitVerdict(box);
	});

	it('agrees with fitVerdict on random boxes', async () => {
		const dim = fc.integer({ min: 20, max: 800 });
		await fc.assert(
			fc.asyncProperty(dim, dim, fc.integer({ min: 10, max: 200 }), async (l, w, h) => {
				await expectReverseMatchesFitVerdict({ l, w, h });
			}),
			{ numRuns: 40 }
		);
	});

	it('lists head units by dash and speakers by location', async () => {
		const dash = await vehiclesForPart(headUnit);
		expect(dash.check).toBe('dash');
		expect(dash.matches).toEqual([expect.objectContaining({ vehicleSlug: tarrow, verdict: 'fits', margins: { depth: 25 } })]);
		const spk = await vehiclesForPart(speaker);
		expect(spk.matches).toEqual([expect.objectContaining({ vehicleSlug: tarrow, seat: 'Front door', verdict: 'tight' })]);
	});

	it('refuses an absurd box with a readable message', async () => {
		await expect(vehiclesForBox({ l: 0, w: 10, h: 10 })).rejects.toMatchObject({ status: 400, message: 'Part length must be more than 0 mm.' });
	});
});

describe('trust marks', () => {
	it('counts installers who confirmed, once each per revision', async () => {
		const { vehicle } = await latest(tarrow);
		const first = await confirmPage(vehicle.id, { note: 'Fitted a mono amp under the passenger seat.' }, viewer);
		const again = await confirmPage(vehicle.id, {}, viewer);
		expect(first.created).toBe(true);
		expect(again).toEqual({ id: first.id, created: false });
		await confirmPage(vehicle.id, {}, secondViewer);
		const summary = await trustOf(tarrow);
		expect(summary.confirmations).toMatchObject({ installers: 2, onCurrentRevision: 2, latest: { by: 'Installer Two' } });
		const current = await revisionById(vehicle.latestRevisionId!);
		expect(flaggableFields(current!.content).map((f) => f.path)).toContain('seats.spaces[drv].heightMm');
	});

	it('keeps a flag open until the flagged field changes', async () => {
		const { vehicle, rev } = await latest(tarrow);
		await flagField(vehicle.id, { fieldPath: 'seats.spaces[drv].heightMm', note: 'Only 55 mm with the seat fully down.' }, viewer);
		let summary = await trustOf(tarrow);
		expect(summary.openFlags).toEqual([
			expect.objectContaining({ fieldPath: 'seats.spaces[drv].heightMm', label: 'Driver seat space, height', by: 'Installer One', value: '60 mm' })
		]);
		expect(Object.keys(summary.flagsByField)).toEqual(['seats.spaces[drv].heightMm']);

		// Another field changing leaves it open; fixing the flagged one closes it.
		const other = structuredClone(rev.content);
		other.dash.depthMm = 186;
		const saved = await saveRevision(vehicle.id, { baseRevisionId: rev.id, content: other, summary: 'dash depth' }, writer);
		expect((await trustOf(tarrow)).openFlags).toHaveLength(1);
		const fixed = structuredClone(other);
		fixed.seats.spaces[0].heightMm = 55;
		await saveRevision(vehicle.id, { baseRevisionId: saved.revisionId, content: fixed, summary: 'driver seat height corrected' }, writer);
		summary = await trustOf(tarrow);
		expect(summary.openFlags).toEqual([]);
		expect(summary.closedFlags).toBe(1);
		// the earlier confirmations still count, but not on this revision
		expect(summary.confirmations).toMatchObject({ installers: 2, onCurrentRevision: 0 });
	});

	it('refuses a flag without a note, on a field the page does not have, or on a revision that is no longer current', async () => {
		const { vehicle, rev } = await latest(tarrow);
		const before = await Confirmation.count();
		await expect(flagField(vehicle.id, { fieldPath: 'seats.spaces[drv].heightMm', note: '' }, viewer)).rejects.toMatchObject({ status: 400, fieldErrors: { note: expect.any(String) } });
		await expect(flagField(vehicle.id, { fieldPath: 'seats.spaces[nope].heightMm', note: 'wrong' }, viewer)).rejects.toMatchObject({ status: 400, fieldErrors: { fieldPath: expect.any(String) } });
		await expect(flagField(vehicle.id, { fieldPath: 'seats.spaces[drv', note: 'wrong' }, viewer)).rejects.toMatchObject({ status: 400 });
		await expect(confirmPage(vehicle.id, { revisionId: rev.parentId! }, viewer)).rejects.toMatchObject({ status: 409 });
		expect(await Confirmation.count()).toBe(before);
	});
});
