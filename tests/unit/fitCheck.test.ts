import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { bestSpace, dashFit, pickLocation, pickSpace, seatFitReason, seatSpaceFits, speakerFitReason, speakerLocationFits } from '../../src/lib/domain/fitCheck';
import type { SpeakerLocation } from '../../src/lib/domain/content/schema';
import { seatSpace as space } from '../helpers/places';

// Invented seat spaces and speaker locations (sample data).
const box = { l: 300, w: 200, h: 50 };
const spaces = [space('d', 'driver', 310, 210, 60), space('p', 'passenger', 270, 420, 100), space('r', 'rear', 400, 300, 59), space('x', 'rear', 500, null, 90)];

describe('a box against every seat space', () => {
	it('gives each space its verdict, by hand with 10 mm clearance', () => {
		// driver: exact fit (0 mm) → tight; passenger: only turned, 40 mm height; rear: 59 − 60 = −1 mm; x: width not measured
		expect(seatSpaceFits(spaces, box).map((f) => [f.spaceId, f.result.verdict, f.result.rotated])).toEqual([
			['d', 'tight', false],
			['p', 'fits', true],
			['r', 'no-fit', false],
			['x', 'not-measured', false]
		]);
	});

	it('picks the asked-for space by id or seat, else the best one', () => {
		const fits = seatSpaceFits(spaces, box);
		expect(pickSpace(fits, 'r')?.spaceId).toBe('r');
		expect(pickSpace(fits, 'driver')?.spaceId).toBe('d');
		expect(pickSpace(fits, 'nowhere')?.spaceId).toBe('p');
		expect(bestSpace(fits)?.spaceId).toBe('p');
		expect(bestSpace([])).toBeNull();
	});

	it('never prefers a seat where the part does not fit over one nobody measured', () => {
		// by hand: r is 1 mm too tall; x has no width, so it may still take the part
		const fits = seatSpaceFits([spaces[2], spaces[3]], box);
		expect(bestSpace(fits)?.spaceId).toBe('x');
		// a missing width does not hide a height that already rules the part out: 55 − 60 = −5 mm
		const [y] = seatSpaceFits([space('y', 'rear', 500, null, 55)], box);
		expect(y.result.verdict).toBe('no-fit');
		expect(seatFitReason(y)).toBe('Does not fit under the rear seat: 5 mm too tall after 10 mm for cables and air. The other sides are not measured yet.');
	});

	it('prefers more room when two spaces have the same verdict', () => {
		const fits = seatSpaceFits([space('a', 'driver', 400, 300, 90), space('b', 'passenger', 400, 300, 120)], box);
		// by hand: a leaves 30 mm in height, b leaves 60 mm
		expect(bestSpace(fits)?.spaceId).toBe('b');
	});

	it('says the answer in words, in either unit', () => {
		const [d, p, r, x] = seatSpaceFits(spaces, box);
		expect(seatFitReason(d)).toBe('Goes in under the driver seat, but only 0 mm to spare in length after 10 mm for cables and air: check on the car.');
		expect(seatFitReason(p)).toMatch(/^Fits under the passenger seat with 40 mm to spare in height, the closest side after 10 mm for cables and air\. Turned a quarter/);
		expect(seatFitReason(r)).toBe('Does not fit under the rear seat: 1 mm too tall after 10 mm for cables and air.');
		expect(seatFitReason(x)).toBe('The space under the rear seat is not measured yet (width missing), so nobody can say.');
		// 40 mm = 1.57 in (mathjs)
		expect(seatFitReason(p, 'imperial')).toContain(`${unit(40, 'mm').toNumber('inch').toFixed(2)} in to spare`);
	});
});

describe('speakers and head units', () => {
	const loc = (id: string, name: string, cutoutMm: number | null, depthMm: number | null): SpeakerLocation => ({ id, location: name, nominalSize: '', cutoutMm, depthMm, impedanceOhm: 4, grille: '' });
	const speaker = { cutoutMm: 142, mountingDepthMm: 58 };

	it('checks every location and picks the roomiest one', () => {
		const fits = speakerLocationFits([loc('a', 'Front door', 145, 62), loc('b', 'Rear deck', 160, 90), loc('c', 'Dash', null, 30)], speaker);
		// by hand: a 3 / 4 mm → tight; b 18 / 32 mm → fits (and 18 mm over the cut-out needs a ring);
		// c has no cut-out, but its 30 mm depth is 28 mm short of 58 mm, so it is ruled out already
		expect(fits.map((f) => f.result.verdict)).toEqual(['tight', 'fits', 'no-fit']);
		expect(pickLocation(fits)?.locationId).toBe('b');
		expect(pickLocation(fits, 'a')?.locationId).toBe('a');
		expect(speakerFitReason(fits[1])).toMatch(/use an adapter ring/);
		expect(speakerFitReason(fits[0])).toBe('Goes into the front door location, with only 3 mm to spare on the cut-out: check on the car.');
	});

	it('prefers a place nobody measured over one where the part certainly does not fit', () => {
		// by hand: c is 28 mm too shallow; d is not measured at all
		const fits = speakerLocationFits([loc('c', 'Dash', null, 30), loc('d', 'Kick panel', null, null)], speaker);
		expect(fits.map((f) => f.result.verdict)).toEqual(['no-fit', 'not-measured']);
		expect(pickLocation(fits)?.locationId).toBe('d');
	});

	it('compares a recorded opening, with both sides measured, with the unit face', () => {
		// a measured 178 × 100 mm opening is narrower than the 180 mm face (ISO 7736)
		const dash = { opening: 'double-din' as const, depthMm: 260, openingWidthMm: 178, openingHeightMm: 100 };
		expect(dashFit({ dinSize: 2, chassisDepthMm: 150 }, dash).verdict).toBe('no-fit');
		// with only one side measured the opening type's aperture decides: 260 − 150 − 50 = 60 (by hand)
		expect(dashFit({ dinSize: 2, chassisDepthMm: 150 }, { ...dash, openingHeightMm: null })).toMatchObject({ verdict: 'fits', depthMarginMm: 60 });
	});

	it('says not measured when the dash opening is not recorded', () => {
		expect(dashFit({ dinSize: 1, chassisDepthMm: 150 }, { opening: null, depthMm: 200 }).verdict).toBe('not-measured');
		// 225 − 150 − 50 for plugs = 25 mm (by hand); a seat clearance passed along does not change the depth check
		expect(dashFit({ dinSize: 2, chassisDepthMm: 150 }, { opening: 'double-din', depthMm: 225 })).toMatchObject({ verdict: 'fits', depthMarginMm: 25 });
		expect(dashFit({ dinSize: 2, chassisDepthMm: 150 }, { opening: 'double-din', depthMm: 225 }, { clearanceMm: 40 })).toMatchObject({ depthMarginMm: 25 });
	});
});
