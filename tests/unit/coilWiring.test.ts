import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate } from 'mathjs';
import { ampLoadCheck, wiringOptions, type AmpLoadFigures } from '../../src/lib/domain/coilWiring';
import { loadInputSchema } from '../../src/lib/domain/calcSchemas';

const ohmsOf = (drivers: Parameters<typeof wiringOptions>[0], bridged = false) => wiringOptions(drivers, { bridged }).map((o) => o.ohms);

describe('wiring options', () => {
	it('two dual 4 Ω drivers give 1, 4 and 16 Ω', () => {
		// Hand-worked by Ohm's law: coils in series 8 Ω a driver → 2 in series 16, in parallel 4;
		// coils in parallel 2 Ω a driver → 2 in series 4, in parallel 1.
		const options = wiringOptions([{ count: 2, coils: 2, ohmsPerCoil: 4 }]);
		expect(options.map((o) => o.ohms)).toEqual([1, 4, 4, 16]);
		expect([...new Set(options.map((o) => o.ohms))]).toEqual([1, 4, 16]);
		expect(options[0]).toMatchObject({ coilWiring: 'parallel', driverWiring: 'parallel', driverOhms: 2, wiring: 'Coils in parallel (2 Ω a driver), 2 drivers in parallel' });
		expect(options[3]).toMatchObject({ coilWiring: 'series', driverWiring: 'series', driverOhms: 8 });
	});

	it('one dual 2 Ω driver: 4 Ω in series, 1 Ω in parallel', () => {
		// Hand-worked: 2 + 2 = 4; 1/(1/2 + 1/2) = 1.
		expect(ohmsOf([{ count: 1, coils: 2, ohmsPerCoil: 2 }])).toEqual([1, 4]);
	});

	it('one single-coil driver is its own impedance', () => {
		expect(wiringOptions([{ count: 1, coils: 1, ohmsPerCoil: 4 }])).toEqual([
			{ wiring: 'One driver', ohms: 4, coilWiring: 'single', driverWiring: 'single', driverOhms: 4, inSeries: 1, strings: 1 }
		]);
	});

	it('four single 4 Ω drivers include the 4 Ω series-parallel bank', () => {
		// Hand-worked: 4 in series 16; 2 strings of 2 → 8/2 = 4; 4 in parallel 1.
		const options = wiringOptions([{ count: 4, coils: 1, ohmsPerCoil: 4 }]);
		expect(options.map((o) => o.ohms)).toEqual([1, 4, 16]);
		expect(options[1]).toMatchObject({ driverWiring: 'series-parallel', inSeries: 2, strings: 2 });
	});

	it('three dual 4 Ω drivers match mathjs', () => {
		// mathjs as the reference for the series/parallel sums (no equal-string split of 3 exists).
		const par = (...zs: number[]) => evaluate(`1 / (${zs.map((z) => `1/${z}`).join(' + ')})`) as number;
		const expected = [par(2, 2, 2), par(8, 8, 8), evaluate('2+2+2') as number, evaluate('8+8+8') as number].sort((a, b) => a - b);
		ohmsOf([{ count: 3, coils: 2, ohmsPerCoil: 4 }]).forEach((z, i) => expect(z).toBeCloseTo(expected[i], 12));
	});

	it('groups of the same driver count together', () => {
		expect(ohmsOf([{ count: 1, coils: 2, ohmsPerCoil: 4 }, { count: 1, coils: 2, ohmsPerCoil: 4 }])).toEqual([1, 4, 4, 16]);
	});

	it('bridged: each side sees half the load', () => {
		// Hand-worked: a bridged pair splits the load between its two channels, 4 Ω → 2 Ω a side.
		const options = wiringOptions([{ count: 2, coils: 2, ohmsPerCoil: 4 }], { bridged: true });
		expect(options.map((o) => o.perSideOhms)).toEqual([0.5, 2, 2, 8]);
		expect(wiringOptions([{ count: 1, coils: 1, ohmsPerCoil: 4 }])[0].perSideOhms).toBeUndefined();
	});

	it.each([
		[[{ count: 1, coils: 2, ohmsPerCoil: 4 }, { count: 1, coils: 1, ohmsPerCoil: 4 }], 'Wire only identical drivers together: every group needs the same voice coils and impedance per coil.'],
		[[{ count: 9, coils: 1, ohmsPerCoil: 4 }], 'At most 8 drivers on one amplifier channel.'],
		[[{ count: 1, coils: 3, ohmsPerCoil: 4 }], 'Voice coils must be 1 (single) or 2 (dual).'],
		[[{ count: 1, coils: 1, ohmsPerCoil: 0 }], 'Impedance per coil must be more than 0 Ω.'],
		[[], 'Give at least one group of drivers.']
	])('refuses %j', (drivers, message) => {
		expect(() => wiringOptions(drivers as never)).toThrow(message);
		expect(loadInputSchema.safeParse({ drivers }).error?.issues[0].message).toBe(message);
	});

	const group = fc.record({ count: fc.integer({ min: 1, max: 8 }), coils: fc.constantFrom(1 as const, 2 as const), ohmsPerCoil: fc.constantFrom(1, 2, 4, 8, 16) });

	it('property: all drivers in parallel is the lowest option, all in series the highest', () => {
		// Ohm's law: a parallel bank is never above its smallest branch, a series string never below its largest part.
		fc.assert(
			fc.property(group, (g) => {
				const options = wiringOptions([g]);
				const lowest = g.coils === 2 ? g.ohmsPerCoil / 2 / g.count : g.ohmsPerCoil / g.count;
				const highest = g.coils === 2 ? 2 * g.ohmsPerCoil * g.count : g.ohmsPerCoil * g.count;
				expect(options[0].ohms).toBeCloseTo(lowest, 9);
				expect(options.at(-1)!.ohms).toBeCloseTo(highest, 9);
				for (const o of options) {
					if (o.driverWiring === 'parallel') expect(o.ohms).toBeLessThanOrEqual(o.driverOhms + 1e-9);
					if (o.driverWiring === 'series') expect(o.ohms).toBeGreaterThanOrEqual(o.driverOhms - 1e-9);
				}
			})
		);
	});

	it('property: every option dissipates the same share in each driver (equal strings)', () => {
		fc.assert(
			fc.property(group, (g) => {
				for (const o of wiringOptions([g])) {
					expect(o.inSeries * o.strings).toBe(g.count);
					// Z = Zd · s / p (identical strings in parallel)
					expect(o.ohms).toBeCloseTo((o.driverOhms * o.inSeries) / o.strings, 9);
				}
			})
		);
	});
});

describe('against an amplifier', () => {
	// Invented amplifier figures (sample data), not a real product.
	const amp: AmpLoadFigures = { rms4OhmW: 300, rms2OhmW: 500, rms1OhmW: 800, minLoadOhm: 1, bridgeable: false, bridgedRmsW: null };
	const pair: AmpLoadFigures = { rms4OhmW: 75, rms2OhmW: 110, rms1OhmW: null, minLoadOhm: 2, bridgeable: true, bridgedRmsW: 220 };

	it('takes the rated figure at the load itself', () => {
		expect(ampLoadCheck(amp, 2)).toMatchObject({ ok: true, ratedW: 500, ratedAtOhm: 2 });
		expect(ampLoadCheck(amp, 1).message).toMatch(/Rated 800 W RMS at 1 Ω/);
	});

	it('between rated loads, takes the next rated load above and never interpolates', () => {
		// 3 Ω lies between 2 and 4 Ω: the 4 Ω figure is used, not a figure between 300 and 500 W.
		const c = ampLoadCheck(amp, 3);
		expect(c).toMatchObject({ ok: true, ratedW: 300, ratedAtOhm: 4 });
		expect(c.message).toMatch(/nearest rated load at or above 3 Ω \(not interpolated\)/);
		expect(ampLoadCheck(amp, 4 / 3)).toMatchObject({ ratedW: 500, ratedAtOhm: 2 });
	});

	it('above the highest rated load has no figure', () => {
		expect(ampLoadCheck(amp, 8)).toMatchObject({ ok: true, ratedW: null, ratedAtOhm: null });
		expect(ampLoadCheck(amp, 8).message).toMatch(/expect less/);
	});

	it('below the minimum stable load is refused', () => {
		expect(ampLoadCheck(pair, 1)).toMatchObject({ ok: false, ratedW: null });
		expect(ampLoadCheck(pair, 1).message).toBe("Too low: the channel sees 1 Ω, below the amplifier's minimum stable load of 2 Ω.");
	});

	it('takes 4 Ω as the minimum when none is recorded', () => {
		// Conservative default (common practice).
		const unknown = { ...pair, minLoadOhm: null };
		expect(ampLoadCheck(unknown, 2).ok).toBe(false);
		expect(ampLoadCheck(unknown, 2).message).toMatch(/no minimum load recorded/);
		expect(ampLoadCheck(unknown, 4).ok).toBe(true);
	});

	it('bridged: each side sees half, the bridged figure at 4 Ω', () => {
		// Hand-worked: 4 Ω bridged → 2 Ω a side, at the 2 Ω minimum; the maker's 4 Ω bridged figure applies.
		expect(ampLoadCheck(pair, 4, true)).toMatchObject({ ok: true, ratedW: 220, ratedAtOhm: 4 });
		// 2 Ω bridged → 1 Ω a side, below the 2 Ω minimum.
		expect(ampLoadCheck(pair, 2, true)).toMatchObject({ ok: false });
		expect(ampLoadCheck(pair, 2, true).message).toMatch(/each side sees 1 Ω/);
	});

	it('bridged without a bridged figure: twice a channel at the half load', () => {
		// P = V²/R: bridged into R each channel swings the same voltage as into R/2 alone, so 2 × P(R/2).
		// 8 Ω bridged → 4 Ω a side → 2 × 75 W = 150 W.
		expect(ampLoadCheck({ ...pair, bridgedRmsW: null }, 8, true)).toMatchObject({ ok: true, ratedW: 150, ratedAtOhm: 4 });
		expect(ampLoadCheck({ ...pair, bridgedRmsW: null }, 8, true).message).toMatch(/twice the 75 W/);
	});

	it('refuses to bridge an amplifier that cannot be', () => {
		expect(ampLoadCheck(amp, 4, true)).toMatchObject({ ok: false, message: 'This amplifier cannot be bridged: wire the load to one channel.' });
	});

	it('property: a stable load never rates more power than a lower stable load', () => {
		fc.assert(
			fc.property(fc.double({ min: 1, max: 16, noNaN: true }), fc.double({ min: 1, max: 16, noNaN: true }), (a, b) => {
				const [lo, hi] = a < b ? [a, b] : [b, a];
				const wLo = ampLoadCheck(amp, lo).ratedW;
				const wHi = ampLoadCheck(amp, hi).ratedW;
				if (wHi !== null) expect(wLo).not.toBeNull();
				if (wLo !== null && wHi !== null) expect(wHi).toBeLessThanOrEqual(wLo);
			})
		);
	});
});
