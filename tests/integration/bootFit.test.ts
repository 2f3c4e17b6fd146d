import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { emptyContent, type VehicleContent } from '../../src/lib/domain/content/schema';
import type { Part } from '../../src/lib/domain/part';
import { createVehicle, revisionById, saveRevision } from '../../src/lib/server/services/revisions';
import { requireVehicle } from '../../src/lib/server/services/vehicles';
import { createPart } from '../../src/lib/server/services/parts';
import { checkBootFit, vehiclesForBootBox, vehiclesForBootPart } from '../../src/lib/server/services/bootFit';
import { resetSeatSpaceIndex } from '../../src/lib/server/fit';
import type { SessionUser } from '../../src/lib/domain/sessionUser';

// Invented boots and parts (sample data); margins worked by hand with the default 10 mm clearance.
let writer: SessionUser;
let box: Part;
let headUnit: Part;
const slugs: Record<string, string> = {};

function page(model: string, boot: Partial<VehicleContent['boot']>): VehicleContent {
	const c = emptyContent({ make: 'Quillan', model, yearFrom: 2014, yearTo: 2019, body: 'wagon' });
	Object.assign(c.boot, boot);
	return c;
}

beforeAll(async () => {
	await freshDatabase('bootfit');
	writer = await makeUser('editor', 'Writer One');
	const moderator = await makeUser('moderator');
	box = await createPart({ kind: 'enclosure', sku: 'T-BOX', name: 'Test box', lengthMm: 600, widthMm: 400, heightMm: 350 }, moderator);
	headUnit = await createPart({ kind: 'head-unit', sku: 'T-HU', name: 'Test double DIN', dinSize: 2, chassisDepthMm: 150 }, moderator);
	const pages = [
		// 900 − 600 − 10 = 290 deep, 950 − 400 − 10 = 540 wide, 450 − 350 − 10 = 90 high; opening leaves 150
		page('Ashby', { floorLengthMm: 900, floorWidthMm: 1000, archWidthMm: 950, heightMm: 450, openingWidthMm: 950, openingHeightMm: 500 }),
		// opening 380 × 340: 20 mm too wide the best way round
		page('Brill', { floorLengthMm: 900, floorWidthMm: 1000, heightMm: 450, openingWidthMm: 380, openingHeightMm: 340 }),
		// height not measured
		page('Coble', { floorLengthMm: 900, floorWidthMm: 1000, openingWidthMm: 950, openingHeightMm: 500 })
	];
	for (const c of pages) slugs[c.identity.model] = (await createVehicle(c, writer)).slug;
	resetSeatSpaceIndex();
});

afterAll(() => closeDb());

describe('an enclosure against one page', () => {
	it('goes through the opening and stands in the boot with its margins', async () => {
		const a = await checkBootFit({ vehicle: slugs.Ashby, partId: box.id }, writer);
		expect(a.fit).toMatchObject({ verdict: 'fits', throughOpening: true, limiting: 'h', margins: { l: 290, w: 540, h: 90 } });
		expect(a.reason).toMatch(/90 mm to spare in height/);
	});

	it('stops at a load opening that is too small', async () => {
		const a = await checkBootFit({ vehicle: slugs.Brill, box: { l: 600, w: 400, h: 350 } }, writer);
		expect(a.fit).toMatchObject({ verdict: 'no-fit', throughOpening: false, limiting: 'opening' });
	});

	it('answers a person for a part that has no box or a request that names neither', async () => {
		await expect(checkBootFit({ vehicle: slugs.Ashby, partId: headUnit.id }, writer)).rejects.toMatchObject({ status: 400, message: expect.stringMatching(/not checked against the boot/) });
		await expect(checkBootFit({ vehicle: slugs.Ashby }, writer)).rejects.toMatchObject({ status: 400, message: expect.stringMatching(/Give either partId or box/) });
	});
});

describe('which vehicles take this box in the boot', () => {
	it('lists the boots that take it, and those not measured enough to say', async () => {
		const a = await vehiclesForBootPart(box.id);
		expect(a.matches.map((m) => m.vehicleSlug)).toEqual([slugs.Ashby]);
		expect(a.notMeasured.map((m) => m.vehicleSlug)).toEqual([slugs.Coble]);
		expect(a.searched.vehicles).toBe(3);
	});

	it('reads the revision saved after the index was built', async () => {
		const v = await requireVehicle(slugs.Coble);
		const rev = (await revisionById(v.latestRevisionId!))!;
		const content = structuredClone(rev.content);
		content.boot.heightMm = 380; // 380 − 350 − 10 = 20 mm (by hand), over the 15 mm tight threshold
		await saveRevision(v.id, { baseRevisionId: rev.id, content, summary: 'boot height' }, writer);
		const a = await vehiclesForBootBox({ l: 600, w: 400, h: 350 });
		expect(a.matches.map((m) => [m.vehicleSlug, m.verdict, m.margins.h])).toEqual([
			[slugs.Ashby, 'fits', 90],
			[slugs.Coble, 'fits', 20]
		]);
	});

	it('refuses a clearance out of range', async () => {
		await expect(vehiclesForBootBox({ l: 600, w: 400, h: 350 }, { clearanceMm: -1 })).rejects.toMatchObject({ status: 400 });
	});
});
