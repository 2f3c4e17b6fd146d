import { describe, expect, it } from 'vitest';
import { evaluate } from 'mathjs';
import { cutLength, jobSheet, speakerGauge } from '../../src/lib/domain/jobSheet';
import { emptyContent, type VehicleContent } from '../../src/lib/domain/content/schema';
import { partInputSchema, type Part } from '../../src/lib/domain/part';

// An invented vehicle page and catalogue (sample data).
function page(): VehicleContent {
	const c = emptyContent({ make: 'Quillan', model: 'Tarrow', yearFrom: 2011, yearTo: 2015, body: 'sedan' });
	c.power.runs = [
		{ id: 'boot', to: 'boot', lengthM: null },
		{ id: 'seat', to: 'under the passenger seat', lengthM: 4.8 }
	];
	c.power.fuseHolderSpot = 'battery tray bracket';
	c.seats.spaces = [
		{ id: 'd', seat: 'driver', lengthMm: 310, widthMm: 210, heightMm: 60, obstacles: '', boardNeeded: false, travelNotes: '' },
		{ id: 'p', seat: 'passenger', lengthMm: 505, widthMm: 380, heightMm: 95, obstacles: '', boardNeeded: false, travelNotes: '' }
	];
	c.harness.ladder.lines = [
		{ id: 'l1', name: 'Line 1', buttons: [{ id: 'a', name: 'Vol +', ohms: 1000 }, { id: 'b', name: 'Vol −', ohms: null }] },
		{ id: 'l2', name: 'Line 2', buttons: [{ id: 'c', name: 'Mode', ohms: 1020 }] }
	];
	return c;
}
const amp = { id: 1, ...partInputSchema.parse({ kind: 'amplifier', sku: 'A4', name: 'Four-channel', lengthMm: 200, widthMm: 140, heightMm: 45, channels: 4, rmsWattsPerChannel: 60, ampClass: 'D', efficiency: 0.85 }) } as Part;

describe('job sheet', () => {
	it('works out draw, gauge, fuse and the cut list from the page run', () => {
		const sheet = jobSheet({ content: page(), parts: [amp] });
		// I = 4 × 60 W / (0.85 × 14.4 V), mathjs
		expect(sheet.currentA).toBeCloseTo(evaluate('240 W / (0.85 * 14.4 V)').toNumber('A'), 9);
		// first run with a length is the default; the ground lead defaults to 0.5 m (common practice)
		expect(sheet.powerRun).toMatchObject({ id: 'seat', lengthM: 4.8, typed: false });
		// 19.6 A over a 5.3 m loop: 12 AWG (3.31 mm², 5.21 mΩ/m) drops 3.8 %, 10 AWG (5.26 mm², 3.28 mΩ/m) 2.4 %
		// under the 3 % target (ABYC E-11), by R = ρL/A with IEC 60028 ρ; then the smallest ISO 8820-3 rating ≥ 19.6 A is 20 A
		const drop10 = evaluate(`(1/58 ohm mm^2/m) * 5.3 m / (5.261 mm^2) * ${sheet.currentA} A / 14.4 V * 100`);
		expect(drop10).toBeLessThan(3);
		expect(sheet.wire).toMatchObject({ ok: true, awg: '10' });
		expect(sheet.fuse).toMatchObject({ ok: true, fuseA: 20, kind: 'blade', spot: 'battery tray bracket' });
		expect(sheet.cutList.map((l) => [l.item, l.count, l.cutM, l.gauge])).toEqual([
			['power', 1, 5.3, '10 AWG'],
			['ground', 1, 0.6, '10 AWG'],
			['remote', 1, 5.3, '18 AWG'],
			['speaker', 4, 5.3, '16 AWG']
		]);
		expect(sheet.gaps).toEqual([]);
	});

	it('cuts about 10 % long, rounded up to 10 cm (common practice)', () => {
		expect(cutLength(4.8)).toBe(5.3); // 5.28 → 5.3
		expect(cutLength(1)).toBe(1.1);
		expect(cutLength(0.5)).toBe(0.6); // 0.55 → 0.6
	});

	it('picks speaker gauge so the lead stays under 5 % of the impedance (common practice)', () => {
		// 4.8 m run, 9.6 m of copper; 5 % of 4 Ω = 0.2 Ω. Handbook Ω/km at 20 °C (from memory): 18 AWG 20.9, 16 AWG 13.2
		expect(evaluate('20.9 ohm/km * 9.6 m').toNumber('ohm')).toBeGreaterThan(0.2);
		expect(evaluate('13.2 ohm/km * 9.6 m').toNumber('ohm')).toBeLessThan(0.2);
		expect(speakerGauge(4.8, 4)).toBe(16);
		expect(speakerGauge(2, 4)).toBe(18);
		expect(speakerGauge(4.8, 2)).toBe(14);
	});

	it('runs the remote lead in a spare core when asked, and follows typed lengths', () => {
		const sheet = jobSheet({ content: page(), parts: [amp], powerM: 3, groundM: 0.3, speakers: 4, coresPerCable: 4, remoteInSpeakerCable: true });
		expect(sheet.powerRun).toMatchObject({ lengthM: 3, typed: true });
		expect(sheet.cutList.find((l) => l.item === 'remote')).toBeUndefined();
		// 4 speakers × 2 + remote = 9 conductors in 4-core cables: 2 cables hold 8, so a third (speakerCablePlan)
		expect(sheet.speakerCable).toMatchObject({ conductors: 9, cables: 3, spareCores: 3 });
	});

	it('says what it cannot work out', () => {
		const c = page();
		c.power.runs = [];
		const sheet = jobSheet({ content: c, parts: [amp] });
		expect(sheet.wire).toBeNull();
		expect(sheet.gaps[0]).toMatch(/No power run length/);
		expect(sheet.cutList.find((l) => l.item === 'power')).toMatchObject({ lengthM: null, cutM: null, gauge: null });
	});

	it('places the parts and checks the ladder', () => {
		const sheet = jobSheet({ content: page(), parts: [amp], seat: 'd' });
		// 310 − 200 − 10 = 100, 210 − 140 − 10 = 60, 60 − 45 − 10 = 5 → tight under the driver seat
		expect(sheet.mounting[0].seat?.chosen).toMatchObject({ spaceId: 'd', result: { verdict: 'tight', limiting: 'h' } });
		// 1000 Ω and 1020 Ω overlap at ±5 %; unmeasured buttons are left out
		expect(sheet.ladder?.lines.map((l) => l.buttons.length)).toEqual([1, 1]);
		expect(sheet.ladder?.report.collides).toBe(true);
		expect(sheet.ladder?.separator).toMatchObject({ ok: true });
		expect(sheet.cautions).toContain('Disconnect the battery before working on power wiring.');
		expect(sheet.cautions[sheet.cautions.length - 1]).toBe("Follow the vehicle maker's procedures, local codes and licensed practice.");
	});
});
