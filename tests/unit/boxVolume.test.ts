import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate, unit } from 'mathjs';
import { effectivePortLengthMm, enclosureVolume, helmholtzHz, litresToCubicFeet, portRadiusMm } from '../../src/lib/domain/boxVolume';
import { enclosureInputSchema } from '../../src/lib/domain/calcSchemas';

// Invented box sizes (sample data).
const box = { outside: { l: 500, w: 400, h: 350 }, wallMm: 18, driverDisplacementL: 2.5 };
const round = { kind: 'round', diameterMm: 100, lengthMm: 250 } as const;

describe('net volume', () => {
	it('outside less two walls, less driver and port', () => {
		// Hand-worked: inside 464 × 364 × 314 mm = 53,033,344 mm³ = 53.033 L; port π × 50² × 250 = 1.9635 L;
		// net 53.0333 − 2.5 − 1.9635 = 48.570 L.
		const v = enclosureVolume({ ...box, port: round });
		expect(v.inside).toEqual({ l: 464, w: 364, h: 314 });
		expect(v.grossL).toBeCloseTo(53.033344, 6);
		expect(v.portL).toBeCloseTo(1.963495, 5);
		expect(v.netL).toBeCloseTo(48.569849, 5);
		// 1 ft³ = 28.316846592 L (mathjs units)
		expect(v.netCubicFeet).toBeCloseTo(unit(v.netL, 'L').toNumber('ft^3'), 9);
	});

	it('a sealed box has no tuning', () => {
		const v = enclosureVolume(box);
		expect(v.tuningHz).toBeUndefined();
		expect(v.netL).toBeCloseTo(53.033344 - 2.5, 6);
	});

	it('litres to cubic feet match mathjs', () => {
		expect(litresToCubicFeet(100)).toBeCloseTo(unit(100, 'L').toNumber('ft^3'), 12);
	});

	it.each([
		[{ ...box, wallMm: 200 }, 'wallMm', 'Wall thickness over 100 mm looks like a typo.'],
		[{ ...box, outside: { l: 30, w: 400, h: 350 } }, 'wallMm', 'Walls of 18 mm leave no room inside a box that size.'],
		[{ ...box, port: { ...round, lengthMm: 600 } }, 'port.lengthMm', 'A 600 mm port is longer than the box is inside (464 mm at most); fold it or make the box larger.'],
		[{ ...box, driverDisplacementL: 60 }, 'driverDisplacementL', 'The driver and port take up more than the 53 L inside: nothing is left for the air.'],
		[{ ...box, port: { kind: 'square', lengthMm: 100 } }, 'port.kind', 'Port kind must be "round" or "slot".'],
		[{ ...box, port: { kind: 'slot', widthMm: 300, lengthMm: 100 } }, 'port.heightMm', 'Slot height must be a number of millimetres.']
	])('refuses %j at %s', (input, path, message) => {
		const r = enclosureInputSchema.safeParse(input);
		expect(r.success).toBe(false);
		expect(r.error?.issues[0].path.join('.')).toBe(path);
		expect(r.error?.issues[0].message).toBe(message);
	});
});

describe('port tuning', () => {
	it('round port: Helmholtz with one flanged and one free end', () => {
		// mathjs with units as the reference: f = c/2π √(A / (V L_eff)), L_eff = 250 + (0.85 + 0.6133) × 50 mm.
		const v = enclosureVolume({ ...box, port: round });
		expect(v.effectivePortMm).toBeCloseTo(250 + 1.4633 * 50, 9);
		const reference = evaluate('343 m/s / (2 pi) * sqrt(A / (V * L))', {
			A: unit(Math.PI * 50 ** 2, 'mm^2'),
			V: unit(v.netL, 'L'),
			L: unit(323.165, 'mm')
		});
		expect(v.tuningHz).toBeCloseTo(reference.toNumber('Hz'), 6);
		// Hand-worked: about 38.6 Hz.
		expect(v.tuningHz).toBeCloseTo(38.62, 1);
	});

	it('agrees with the handbook port-length formula within 1 %', () => {
		// Loudspeaker design handbook form (from memory): Lv = 23562.5 × D² / (Fb² × Vb) − 0.732 × D, in cm and
		// litres; its constant assumes c ≈ 344 m/s, so the two agree to within about 1 %.
		for (const [d, fb, vb] of [
			[10, 35, 50],
			[7.5, 45, 30],
			[15, 30, 120]
		]) {
			const lvCm = (23562.5 * d ** 2) / (fb ** 2 * vb) - 0.732 * d;
			const f = helmholtzHz(vb, { kind: 'round', diameterMm: d * 10, lengthMm: lvCm * 10 });
			expect(Math.abs(f - fb) / fb).toBeLessThan(0.01);
		}
	});

	it('slot port: the round port of the same area', () => {
		const slot = { kind: 'slot', widthMm: 300, heightMm: 50, lengthMm: 400 } as const;
		// Hand-worked: 300 × 50 = 15,000 mm²; r = √(15000/π) = 69.099 mm.
		expect(portRadiusMm(slot)).toBeCloseTo(69.0988, 3);
		const asRound = { kind: 'round', diameterMm: 2 * Math.sqrt(15000 / Math.PI), lengthMm: 400 } as const;
		expect(helmholtzHz(60, slot)).toBeCloseTo(helmholtzHz(60, asRound), 9);
		expect(effectivePortLengthMm(slot)).toBeCloseTo(400 + 1.4633 * 69.0988, 2);
	});

	it('property: a longer port or a larger box tunes lower; a wider port higher', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 5, max: 200, noNaN: true }),
				fc.double({ min: 30, max: 200, noNaN: true }),
				fc.double({ min: 20, max: 600, noNaN: true }),
				(vb, d, l) => {
					const p = { kind: 'round', diameterMm: d, lengthMm: l } as const;
					const f = helmholtzHz(vb, p);
					expect(helmholtzHz(vb, { ...p, lengthMm: l * 1.1 })).toBeLessThan(f);
					expect(helmholtzHz(vb * 1.1, p)).toBeLessThan(f);
					expect(helmholtzHz(vb, { ...p, diameterMm: d * 1.1 })).toBeGreaterThan(f);
				}
			)
		);
	});
});
