import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import {
	amplifierEfficiency,
	emptyPartForm,
	partBox,
	partCheck,
	partFieldsFromForm,
	partFormValues,
	partSummary,
	ratedLoads,
	speakerCoils
} from '../../src/lib/domain/part';
import { readPartForm } from '../../src/lib/domain/partForm';
import { partInputSchema } from '../../src/lib/domain/partSchema';
import { AMP_CLASS_EFFICIENCY } from '../../src/lib/domain/power';

// Invented catalogue entries (sample data), not real products.
const amp = { kind: 'amplifier', sku: 'T-4D', name: 'Test four-channel', lengthMm: 200, widthMm: 140, heightMm: 45, channels: 4, rmsWattsPerChannel: 60, ampClass: 'D' } as const;

describe('part schema', () => {
	it('reads each kind and fills the optional figures', () => {
		expect(partInputSchema.parse(amp)).toMatchObject({ ...amp, efficiency: null, fuseRatingA: null, notes: '' });
		expect(partInputSchema.parse({ kind: 'head-unit', sku: 'T-H1', name: 'Head unit', dinSize: 1, chassisDepthMm: 150 })).toMatchObject({ lengthMm: null });
		expect(partInputSchema.parse({ kind: 'speaker', sku: 'T-S', name: 'Speaker', cutoutMm: 142, mountingDepthMm: 58 })).toMatchObject({ impedanceOhm: null, nominalSize: '' });
	});

	it.each([
		[{ ...amp, sku: '' }, 'Give the part its SKU (the shop code on the box).'],
		[{ ...amp, sku: 'has space' }, 'A SKU is letters and digits, with ".", "-", "_" or "/" between them.'],
		[{ ...amp, channels: 0 }, 'An amplifier has at least 1 channel.'],
		[{ ...amp, efficiency: 1.2 }, 'Efficiency cannot be more than 1 (100 %).'],
		[{ ...amp, fuseRatingA: 0 }, "The amplifier's fuse rating must be more than 0 A."],
		[{ ...amp, lengthMm: 9000 }, 'Length over 5000 mm looks like a typo; sizes are in millimetres.'],
		[{ ...amp, ampClass: 'Z' }, 'Amplifier class must be A/B or D.'],
		[{ ...amp, kind: 'subwoofer' }, 'Kind must be one of: Amplifier, Head unit, Speaker, Enclosure.']
	])('answers %j with a message a person understands', (input, message) => {
		const r = partInputSchema.safeParse(input);
		expect(r.success).toBe(false);
		expect(r.error?.issues[0].message).toBe(message);
	});

	it("reads the amplifier's own fuse rating from the catalogue form", () => {
		const r = readPartForm({ ...emptyPartForm('amplifier'), sku: 'T-4D', name: 'Four', lengthMm: '200', widthMm: '140', heightMm: '45', channels: '4', rmsWattsPerChannel: '60', fuseRatingA: '2.5' });
		expect(r.ok && r.part).toMatchObject({ fuseRatingA: 2.5 });
		const bad = readPartForm({ ...emptyPartForm('amplifier'), sku: 'T-4D', name: 'Four', lengthMm: '200', widthMm: '140', heightMm: '45', channels: '4', rmsWattsPerChannel: '60', fuseRatingA: 'lots' });
		expect(!bad.ok && bad.errors.fuseRatingA).toBe('"lots" is not a number.');
	});

	it('takes the typical class efficiency unless the catalogue has its own', () => {
		// typical efficiencies per class are common practice (power.ts)
		expect(amplifierEfficiency({ ampClass: 'D', efficiency: null })).toBe(AMP_CLASS_EFFICIENCY.D);
		expect(amplifierEfficiency({ ampClass: 'A/B', efficiency: null })).toBe(AMP_CLASS_EFFICIENCY.AB);
		expect(amplifierEfficiency({ ampClass: 'D', efficiency: 0.85 })).toBe(0.85);
	});

	it('gives boxes to amplifiers and enclosures only, and names the check', () => {
		expect(partBox(partInputSchema.parse(amp))).toEqual({ l: 200, w: 140, h: 45 });
		expect(partBox(partInputSchema.parse({ kind: 'speaker', sku: 'S', name: 'S', cutoutMm: 142, mountingDepthMm: 58 }))).toBeNull();
		expect([partCheck('amplifier'), partCheck('enclosure'), partCheck('head-unit'), partCheck('speaker')]).toEqual(['seat', 'seat', 'dash', 'speaker']);
		expect(partSummary(partInputSchema.parse(amp))).toBe('200 × 140 × 45 mm, 4 × 60 W RMS, class D');
	});
});

describe('catalogue form', () => {
	it('reads lengths typed in inches exactly', () => {
		// 3.5 in and 7 7/8 in via mathjs (international inch, 25.4 mm exactly)
		const r = readPartForm({ ...emptyPartForm('enclosure'), sku: 'BOX', name: 'Box', lengthMm: '7 7/8', widthMm: '3.5', heightMm: '2"' }, 'in');
		expect(r.ok).toBe(true);
		if (!r.ok) return;
		expect(r.part).toMatchObject({ kind: 'enclosure' });
		const box = partBox(r.part)!;
		expect(box.l).toBeCloseTo(unit(7.875, 'inch').toNumber('mm'), 9);
		expect(box.w).toBeCloseTo(unit(3.5, 'inch').toNumber('mm'), 9);
		expect(box.h).toBeCloseTo(unit(2, 'inch').toNumber('mm'), 9);
	});

	it('round-trips a stored part through the form, in either unit', () => {
		const stored = partInputSchema.parse({ ...amp, lengthMm: 260.35 });
		for (const u of ['mm', 'in'] as const) {
			const back = readPartForm(partFormValues(stored, u), u);
			expect(back.ok).toBe(true);
			// mm are shown to 0.001 mm and inches to 0.0001 in (0.00254 mm)
			if (back.ok) expect(partBox(back.part)!.l).toBeCloseTo(260.35, u === 'mm' ? 6 : 2);
		}
	});

	it('keeps one message per field and says which figures the kind needs', () => {
		const r = readPartForm({ kind: 'head-unit', sku: 'H', name: 'Unit', dinSize: '3', chassisDepthMm: 'deep' });
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.errors.dinSize).toBe('DIN size must be 1 (single DIN) or 2 (double DIN).');
		expect(r.errors.chassisDepthMm).toMatch(/Could not read "deep" as a length/);
		const missing = readPartForm({ kind: 'speaker', sku: 'S', name: 'S' });
		expect(!missing.ok && missing.errors.cutoutMm).toBe('Cut-out diameter is required for this kind of part.');
	});

	it('ignores the figures of kinds not chosen', () => {
		const fields = partFieldsFromForm([
			['kind', 'enclosure'],
			['sku', 'E1'],
			['name', 'Box'],
			['amplifier.lengthMm', 'not a length'],
			['enclosure.lengthMm', '420'],
			['enclosure.widthMm', '300'],
			['enclosure.heightMm', '80']
		]);
		expect(fields).toEqual({ kind: 'enclosure', sku: 'E1', name: 'Box', notes: '', lengthMm: '420', widthMm: '300', heightMm: '80' });
		expect(readPartForm(fields).ok).toBe(true);
	});
});

describe('load figures', () => {
	// Invented figures for a sample amplifier and subwoofers, not real products.
	const rated = { ...amp, rms4OhmW: 60, rms2OhmW: 90, rms1OhmW: null, minLoadOhm: 2, bridgeable: true, bridgedRmsW: 180 };

	it('reads rated power at each load, minimum load and bridging', () => {
		expect(partInputSchema.parse(amp)).toMatchObject({ rms4OhmW: null, rms2OhmW: null, rms1OhmW: null, minLoadOhm: null, bridgeable: false, bridgedRmsW: null });
		const part = partInputSchema.parse(rated);
		expect(part.kind === 'amplifier' && ratedLoads(part)).toEqual([
			{ ohms: 4, watts: 60 },
			{ ohms: 2, watts: 90 }
		]);
	});

	it.each([
		[{ ...rated, rms2OhmW: 0 }, 'RMS per channel at 2 Ω must be more than 0 W.'],
		[{ ...rated, minLoadOhm: 40 }, 'Minimum load over 16 Ω looks like a typo.'],
		[{ ...rated, bridgeable: 'maybe' }, 'Bridgeable must be yes or no.']
	])('refuses %j with a message', (input, message) => {
		const r = partInputSchema.safeParse(input);
		expect(r.success).toBe(false);
		expect(r.error?.issues[0].message).toBe(message);
	});

	it('reads bridging as yes or no from the form, and round-trips it', () => {
		const form = { ...emptyPartForm('amplifier'), sku: 'T-4D', name: 'Four', lengthMm: '200', widthMm: '140', heightMm: '45', channels: '4', rmsWattsPerChannel: '60' };
		const yes = readPartForm({ ...form, bridgeable: 'yes', bridgedRmsW: '180', minLoadOhm: '2', rms2OhmW: '90' });
		expect(yes.ok && yes.part).toMatchObject({ bridgeable: true, bridgedRmsW: 180, minLoadOhm: 2, rms2OhmW: 90 });
		if (yes.ok) expect(partFormValues(yes.part)).toMatchObject({ bridgeable: 'yes', bridgedRmsW: '180', minLoadOhm: '2' });
		const bad = readPartForm({ ...form, bridgeable: 'perhaps' });
		expect(!bad.ok && bad.errors.bridgeable).toBe('Bridgeable must be yes or no.');
		expect(readPartForm(form).ok && readPartForm(form)).toMatchObject({ part: { bridgeable: false } });
	});

	it("reads a speaker's voice coils, and falls back to one coil at the nominal impedance", () => {
		const base = { kind: 'speaker', sku: 'W10', name: 'Sub', cutoutMm: 232, mountingDepthMm: 128 } as const;
		const dual = partInputSchema.parse({ ...base, impedanceOhm: 2, voiceCoils: 2, ohmsPerCoil: 4 });
		expect(dual.kind === 'speaker' && speakerCoils(dual)).toEqual({ coils: 2, ohmsPerCoil: 4 });
		expect(partSummary(dual)).toBe('232 mm cut-out, 128 mm deep, dual 4 Ω coils');
		const single = partInputSchema.parse({ ...base, impedanceOhm: 4 });
		expect(single.kind === 'speaker' && speakerCoils(single)).toEqual({ coils: 1, ohmsPerCoil: 4 });
		const unknown = partInputSchema.parse({ ...base, voiceCoils: 2, impedanceOhm: 2 });
		expect(unknown.kind === 'speaker' && speakerCoils(unknown)).toBeNull();
		expect(partInputSchema.safeParse({ ...base, voiceCoils: 3 }).error?.issues[0].message).toBe('Voice coils must be 1 (single) or 2 (dual).');
	});
});
