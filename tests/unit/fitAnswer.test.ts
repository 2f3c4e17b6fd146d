import { describe, expect, it } from 'vitest';
import { fitAnswer, fitReason, type FitPlaces } from '../../src/lib/domain/fitAnswer';
import { boxSchema, reverseOptionsSchema, reverseQuerySchema, vehicleFitSchema } from '../../src/lib/domain/fitRequest';
import { partSizeProblem, runLengthProblem } from '../../src/lib/domain/sizeRules';
import type { Part } from '../../src/lib/domain/part';
import { seatSpace as space } from '../helpers/places';

// Invented places and parts (sample data). Margins are worked by hand: space − (part + clearance).
const places: FitPlaces = {
	seats: [space('d', 'driver', 310, 210, 60), space('p', 'passenger', 270, 420, 100)],
	dash: { opening: 'double-din', depthMm: 185 },
	speakers: [
		{ id: 'fd', location: 'Front door', cutoutMm: 145, depthMm: 70 },
		{ id: 'rd', location: 'Rear door', cutoutMm: 118, depthMm: 50 }
	]
};
const amp: Part = { id: 1, kind: 'amplifier', sku: 'S-AMP', name: 'Sample amp', notes: '', lengthMm: 300, widthMm: 200, heightMm: 50, channels: 2, rmsWattsPerChannel: 100, ampClass: 'D', efficiency: null } as Part;
const headUnit: Part = { id: 2, kind: 'head-unit', sku: 'S-HU', name: 'Sample double DIN', notes: '', dinSize: 2, chassisDepthMm: 150 } as Part;
const speaker: Part = { id: 3, kind: 'speaker', sku: 'S-SPK', name: 'Sample 6.5', notes: '', cutoutMm: 142, mountingDepthMm: 58, impedanceOhm: 4 } as Part;
const evidence = { 'seat:d': 'driver record', 'seat:p': 'passenger record', dash: 'dash record', 'speaker:fd': 'front door record' };

describe('one fit answer for the fit screen and the endpoint', () => {
	it('checks a box against the asked-for seat, naming its evidence and trust path', () => {
		const a = fitAnswer(places, { part: amp, where: 'driver' }, evidence)!;
		if (a.check !== 'seat') throw new Error('seat check expected');
		// 310 − (300 + 10) = 0 on every axis: an exact fit, tight
		expect(a.chosen?.result).toMatchObject({ verdict: 'tight', margins: { l: 0, w: 0, h: 0 } });
		expect(a).toMatchObject({ clearanceMm: 10, whereFound: true, evidence: 'driver record', place: { evidenceKey: 'seat:d', fieldPath: 'seats.spaces[d]' } });
		expect(fitReason(a, 'metric')).toMatch(/^Goes in under the driver seat, but only 0 mm to spare/);
	});

	it('picks the best seat for a typed box when the asked-for seat is not recorded, and says so', () => {
		const a = fitAnswer(places, { part: null, box: { l: 300, w: 200, h: 50 }, where: 'rear' }, evidence)!;
		if (a.check !== 'seat') throw new Error('seat check expected');
		// passenger, turned: 270 − 210 = 60, 420 − 310 = 110, 100 − 60 = 40 → fits, better than the driver's 0
		expect(a.chosen?.spaceId).toBe('p');
		expect(a.whereFound).toBe(false);
		expect(a.evidence).toBe('passenger record');
	});

	it('has no answer for a seat check without a box', () => {
		expect(fitAnswer(places, { part: null })).toBeNull();
	});

	it('checks a head unit against the dash and a speaker against its locations', () => {
		const dash = fitAnswer(places, { part: headUnit, clearanceMm: 10 }, evidence)!;
		// 185 − (150 chassis + 50 plug and adapter allowance, common practice) = −15 mm: the seat clearance plays no part
		expect(dash).toMatchObject({ check: 'dash', result: { verdict: 'no-fit', depthMarginMm: -15 }, evidence: 'dash record', place: { fieldPath: 'dash' } });
		const spk = fitAnswer(places, { part: speaker }, evidence)!;
		if (spk.check !== 'speaker') throw new Error('speaker check expected');
		// front door: 145 − 142 = 3 mm on the cut-out; rear door: 118 − 142 = −24 mm
		expect(spk.chosen).toMatchObject({ locationId: 'fd', result: { verdict: 'tight', margins: { cutout: 3, depth: 12 } } });
		expect(spk.evidence).toBe('front door record');
		expect(fitAnswer(places, { part: speaker, where: 'nowhere' })!.whereFound).toBe(false);
	});
});

describe('fit requests and the size rules they share', () => {
	it('reads the same part-size limit everywhere', () => {
		expect(boxSchema.safeParse({ l: 5001, w: 1, h: 1 }).error?.issues[0].message).toBe('Part length over 5000 mm looks like a typo; sizes are in millimetres.');
		expect(reverseQuerySchema.safeParse({ l: '5001', w: '1', h: '1' }).success).toBe(false);
		expect(reverseQuerySchema.safeParse({ l: '300', w: '200', h: '50' }).data).toEqual({ l: 300, w: 200, h: 50 });
		expect(partSizeProblem(5001)).toBe('A size over 5000 mm looks like a typo.');
		expect(partSizeProblem(0)).toBe('Must be more than 0.');
		expect(partSizeProblem(5000)).toBeNull();
	});

	it('reads the same clearance range everywhere, 0 to 500 mm', () => {
		expect(reverseOptionsSchema.parse({})).toEqual({ clearanceMm: 10, tightMm: 15 });
		expect(reverseOptionsSchema.safeParse({ clearanceMm: 501 }).error?.issues[0].message).toBe('Clearance over 500 mm looks like a typo.');
		expect(vehicleFitSchema.safeParse({ vehicle: 'x', partId: 1, clearanceMm: -1 }).error?.issues[0].message).toBe('Clearance cannot be negative.');
		expect(vehicleFitSchema.safeParse({ vehicle: 'x', partId: 1, clearanceMm: 500 }).success).toBe(true);
	});

	it('calls a run over 30 m a typo; 30 m is 98.4 ft by the international foot (0.3048 m, exact)', () => {
		expect(runLengthProblem(30.001, 'Power run length')).toBe('Power run length over 30 m (98 ft) looks like a typo.');
		expect(runLengthProblem(0, 'Ground lead length', true)).toBeNull();
		expect(runLengthProblem(0, 'Power run length')).toBe('Power run length must be more than 0.');
	});
});
