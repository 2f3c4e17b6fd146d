import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { unit } from 'mathjs';
import { sealedBox } from '../../src/lib/domain/sealedBox';
import { sealedInputSchema } from '../../src/lib/domain/calcSchemas';

// Invented driver figures (sample data). Formulas: R. H. Small, "Closed-Box Loudspeaker Systems", JAES 1972–73.
describe('sealed box', () => {
	it('a Butterworth box for Fs 30 Hz, Qts 0.4, Vas 60 L', () => {
		// Hand-worked: Qtc/Qts = 0.707/0.4 = 1.7675; α = 1.7675² − 1 = 2.12405625; Vb = 60 / 2.12405625 = 28.2478 L;
		// fc = 30 × 1.7675 = 53.025 Hz.
		const b = sealedBox({ fsHz: 30, qts: 0.4, vasL: 60, qtc: 0.707 });
		expect(b.alpha).toBeCloseTo(2.12405625, 9);
		expect(b.volumeL).toBeCloseTo(28.2478, 3);
		expect(b.fcHz).toBeCloseTo(53.025, 9);
		expect(b.volumeCubicFeet).toBeCloseTo(unit(b.volumeL, 'L').toNumber('ft^3'), 9);
	});

	it('f3 equals fc at Qtc = 1/√2, and is √(1 + √2) × fc at Qtc = 0.5', () => {
		// Second-order high-pass (textbook): maximally flat at Q = 0.707; critically damped at Q = 0.5,
		// where |H| = 1/√2 at f/fc = √(1 + √2) ≈ 1.554.
		const flat = sealedBox({ fsHz: 25, qts: 0.35, vasL: 100, qtc: Math.SQRT1_2 });
		expect(flat.f3Hz).toBeCloseTo(flat.fcHz, 9);
		const damped = sealedBox({ fsHz: 25, qts: 0.35, vasL: 100, qtc: 0.5 });
		expect(damped.f3Hz / damped.fcHz).toBeCloseTo(Math.sqrt(1 + Math.SQRT2), 9);
	});

	it('Qtc 1.0 from Qts 0.5 doubles resonance and takes a third of Vas', () => {
		// Hand-worked: (1.0/0.5)² − 1 = 3, Vb = Vas/3; fc = 2 Fs.
		const b = sealedBox({ fsHz: 28, qts: 0.5, vasL: 90, qtc: 1 });
		expect(b.volumeL).toBeCloseTo(30, 9);
		expect(b.fcHz).toBeCloseTo(56, 9);
	});

	it.each([
		[{ fsHz: 30, qts: 0.8, vasL: 60, qtc: 0.707 }, 'qtc', "Qtc must be higher than the driver's Qts: a sealed box only ever raises Q."],
		[{ fsHz: 0, qts: 0.4, vasL: 60, qtc: 0.707 }, 'fsHz', 'Fs must be more than 0 Hz.'],
		[{ fsHz: 30, qts: 0.4, vasL: '60', qtc: 0.707 }, 'vasL', 'Vas must be a number of litres.']
	])('refuses %j', (input, path, message) => {
		const r = sealedInputSchema.safeParse(input);
		expect(r.error?.issues[0].path.join('.')).toBe(path);
		expect(r.error?.issues[0].message).toBe(message);
	});

	it('property: the box stiffens Q and resonance alike, and a higher Qtc takes a smaller box', () => {
		// Small: fc/Fs = Qtc/Qts = √(α + 1), α = Vas/Vb.
		fc.assert(
			fc.property(
				fc.double({ min: 15, max: 80, noNaN: true }),
				fc.double({ min: 0.2, max: 0.6, noNaN: true }),
				fc.double({ min: 10, max: 300, noNaN: true }),
				fc.double({ min: 0.1, max: 1, noNaN: true }),
				(fs, qts, vas, extra) => {
					const qtc = qts + extra;
					const b = sealedBox({ fsHz: fs, qts, vasL: vas, qtc });
					expect(b.fcHz / fs).toBeCloseTo(Math.sqrt(vas / b.volumeL + 1), 6);
					expect(sealedBox({ fsHz: fs, qts, vasL: vas, qtc: qtc + 0.1 }).volumeL).toBeLessThan(b.volumeL);
				}
			)
		);
	});
});
