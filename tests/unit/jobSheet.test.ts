import { describe, expect, it } from 'vitest';
import { cutLength, jobSheet, speakerGauge } from '../../src/lib/domain/jobSheet';
import { emptyContent, type VehicleContent } from '../../src/lib/domain/content/schema';
import type { Part } from '../../src/lib/domain/part';
import { partInputSchema } from '../../src/lib/domain/partSchema';
import { powerWire } from '../../src/lib/domain/power';
import { distributionPlan } from '../../src/lib/domain/distribution';

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
const amp = { id: 1, ...partInputSchema.parse({ kind: 'amplifier', sku: 'A4', name: 'Four-channel', lengthMm: 200, widthMm: 140, heightMm: 45, channels: 4, rmsWattsPerChannel: 60, ampClass: 'D', efficiency: 0.85, fuseRatingA: 25 }) } as Part;
const mono = { id: 2, ...partInputSchema.parse({ kind: 'amplifier', sku: 'M1', name: 'Mono', lengthMm: 300, widthMm: 200, heightMm: 60, channels: 1, rmsWattsPerChannel: 500, ampClass: 'D', efficiency: 0.88, fuseRatingA: 60 }) } as Part;

describe('job sheet', () => {
	it('works out draw, gauge, fuse and the cut list from the page run, at 12.0 V nominal', () => {
		const sheet = jobSheet({ content: page(), parts: [amp], remoteM: 4.8, speakerM: 4.8 });
		// by hand: I = 4 × 60 W / (0.85 × 12 V) = 23.53 A; at 14.4 V running 19.61 A
		expect(sheet.currentA).toBeCloseTo(23.529, 3);
		expect(sheet.amplifiers[0].runningCurrentA).toBeCloseTo(19.608, 3);
		expect(sheet.basis).toMatch(/^12 V nominal/);
		// first run with a length is the default; the ground lead defaults to 0.5 m (common practice)
		expect(sheet.powerRun).toMatchObject({ id: 'seat', lengthM: 4.8, typed: false });
		// ABYC E-11: 5.3 m = 17.39 ft round trip; 10.75 × 23.53 × 17.39 / 0.36 = 12,217 cmil: 10 AWG (9,343) too little, 8 AWG (14,810)
		expect(sheet.wire).toMatchObject({ ok: true, awg: '8' });
		// fuse ≥ max(1.25 × 23.53 = 29.4 A, the amplifier's own 25 A) → 30 A blade (common practice, ISO 8820-3)
		expect(sheet.fuse).toMatchObject({ ok: true, fuseA: 30, kind: 'blade', spot: 'battery tray bracket' });
		// ASTM B258 areas: 8 AWG 16,510 cmil = 8.37 mm², 18 AWG 1,624 cmil = 0.823 mm², 16 AWG 2,583 cmil = 1.31 mm²
		expect(sheet.cutList.map((l) => [l.item, l.count, l.cutM, l.gauge])).toEqual([
			['power', 1, 5.3, '8 AWG (8.37 mm²)'],
			['ground', 1, 0.6, '8 AWG (8.37 mm²)'],
			['remote', 1, 5.3, '18 AWG (0.823 mm²)'],
			['speaker', 4, 5.3, '16 AWG (1.31 mm²)']
		]);
		expect(sheet.gaps).toEqual([expect.stringMatching(/^Charging budget: the page records no alternator output/)]);
		expect(sheet.material).toBe('copper');
		expect(sheet.basis).toMatch(/copper \(OFC\)/);
		expect(sheet.distribution).toMatchObject({ ok: true, single: true, branches: [] });
	});

	it('asks for the remote and speaker runs instead of copying the power run, and says which', () => {
		const sheet = jobSheet({ content: page(), parts: [amp] });
		expect(sheet.assumptions.join(' ')).toMatch(/Ground lead taken as 0\.5 m/);
		expect(sheet.assumptions.join(' ')).not.toMatch(/as long as the power run/);
		expect(sheet.cutList.find((l) => l.item === 'remote')).toMatchObject({ lengthM: null, cutM: null });
		expect(sheet.cutList.find((l) => l.item === 'speaker')).toMatchObject({ lengthM: null, cutM: null, gauge: null });
		expect(sheet.cutList.find((l) => l.item === 'speaker')?.note).toMatch(/Not measured: type its length/);
		expect(sheet.gaps.join(' ')).toMatch(/No remote lead length: the page records no remote run/);
		expect(sheet.gaps.join(' ')).toMatch(/No speaker run length: the page records no speaker run/);
		const typed = jobSheet({ content: page(), parts: [amp], groundM: 0.4, remoteM: 5, speakerM: 3 });
		expect(typed.assumptions.filter((a) => /taken as .*(long|0\.5 m)/.test(a))).toEqual([]);
		expect(typed.cutList.find((l) => l.item === 'remote')?.note).toMatch(/Typed length/);
	});

	it('fuses each amplifier at the block and the main feed for them all', () => {
		// by hand at 12 V: A4 23.53 A, M1 500 / (0.88 × 12) = 47.35 A, total 70.88 A.
		// main: ≥ max(1.25 × 70.88 = 88.6 A, own fuses 25 + 60 = 85 A) → 100 A maxi blade (ISO 8820-3, from memory)
		// main cable (2 m, its share 2 / 2.8 of 3 % = 2.14 %): 10.75 × 70.88 × 6.56 ft / 0.257 V = 19,446 cmil → 6 AWG (24,538)
		// branches (0.5 m assumed + 0.3 m ground, the 1.47 % left): A4 ≥ 29.4 A → 30 A on 12 AWG (3,769 cmil asked);
		// M1 ≥ max(59.2 A, 60 A) → 60 A, more than 10 AWG carries (55 A, handbook chassis table), so 8 AWG (73 A)
		const sheet = jobSheet({ content: page(), parts: [amp, mono], powerM: 2, groundM: 0.3 });
		expect(sheet.currentA).toBeCloseTo(70.88, 2);
		expect(sheet.fuse).toMatchObject({ ok: true, fuseA: 100 });
		expect(sheet.wire).toMatchObject({ ok: true, awg: '6' });
		const plan = sheet.distribution;
		expect(plan?.ok && plan.branches.map((b) => [b.label, b.wire.fuseA, b.wire.awg])).toEqual([
			['A4', 30, '12'],
			['M1', 60, '8']
		]);
		expect(sheet.cutList.filter((l) => l.item === 'branch').map((l) => l.gauge)).toEqual(['12 AWG (3.31 mm²)', '8 AWG (8.37 mm²)']);
		expect(sheet.assumptions.join(' ')).toMatch(/Branches from the distribution block taken as 0\.5 m/);
	});

	it('asks for the fuse rating an amplifier does not record', () => {
		const bare = { ...amp, fuseRatingA: null } as Part;
		expect(jobSheet({ content: page(), parts: [bare] }).gaps.join(' ')).toMatch(/No fuse rating for A4/);
	});

	it('warns when no stocked speaker gauge meets the loss target', () => {
		// 5 % of 4 Ω = 0.2 Ω; a 35 m run is 70 m of copper; 10 AWG 3.277 Ω/km (AWG table, from memory) gives 0.229 Ω;
		// 5 % of 2 Ω = 0.1 Ω against 60 m × 3.277 Ω/km = 0.197 Ω
		const sheet = jobSheet({ content: page(), parts: [amp], speakerM: 35 });
		expect(sheet.gaps.join(' ')).toMatch(/No stocked speaker gauge keeps the loss under 5 % of 4 Ω over 35 m/);
		expect(speakerGauge(30, 2)).toEqual({ gauge: 10, meets: false });
	});

	it('cuts about 10 % long, rounded up to 10 cm (common practice)', () => {
		expect(cutLength(4.8)).toBe(5.3); // 5.28 → 5.3
		expect(cutLength(1)).toBe(1.1);
		expect(cutLength(0.5)).toBe(0.6); // 0.55 → 0.6
	});

	it('picks speaker gauge so the lead stays under 5 % of the impedance (common practice)', () => {
		// by hand: 4.8 m run, 9.6 m of copper; 5 % of 4 Ω = 0.2 Ω. Handbook Ω/km at 20 °C (from memory): 18 AWG 20.9 → 0.201 Ω
		// (over), 16 AWG 13.2 → 0.127 Ω (under)
		expect(speakerGauge(4.8, 4)).toEqual({ gauge: 16, meets: true });
		expect(speakerGauge(2, 4)).toEqual({ gauge: 18, meets: true });
		expect(speakerGauge(4.8, 2)).toEqual({ gauge: 14, meets: true });
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
		expect(sheet.cautions.join(' ')).toMatch(/Disconnect the battery/);
		expect(sheet.cautions.join(' ')).toMatch(/ABYC E-11 asks for 7 in/);
		expect(sheet.cautions[sheet.cautions.length - 1]).toBe("Follow the vehicle maker's procedures, local codes and licensed practice.");
	});

	it('takes a typed amplifier by power, channels and class, or by its current', () => {
		// by hand: 4 × 80 W class D at the typical 80 % (common practice) and 12 V: 320 / 9.6 = 33.33 A; at 14.4 V 27.78 A
		const sheet = jobSheet({ content: page(), parts: [], typedAmps: [{ name: 'Customer four-channel', rmsWattsPerChannel: 80, channels: 4, ampClass: 'D', fuseA: 40 }], powerM: 4 });
		expect(sheet.amplifiers[0]).toMatchObject({ label: 'Customer four-channel', channels: 4, fuseA: 40 });
		expect(sheet.amplifiers[0].currentA).toBeCloseTo(33.333, 3);
		expect(sheet.amplifiers[0].runningCurrentA).toBeCloseTo(27.778, 3);
		expect(sheet.amplifiers[0].detail).toMatch(/class D at a typical 80 % \(common practice\)/);
		const byCurrent = jobSheet({ content: page(), parts: [], typedAmps: [{ currentA: 45, fuseA: 60 }], powerM: 4 });
		expect(byCurrent.amplifiers[0]).toMatchObject({ label: 'Typed amplifier 1', currentA: 45, runningCurrentA: null, fuseA: 60 });
	});

	it('asks for the class rather than assuming one', () => {
		const sheet = jobSheet({ content: page(), parts: [], typedAmps: [{ rmsWattsPerChannel: 80, channels: 4 }], powerM: 4 });
		expect(sheet.amplifiers).toEqual([]);
		expect(sheet.gaps.join(' ')).toMatch(/Typed amplifier 1: choose its class \(A\/B or D\), or type its current/);
	});

	it('gives the same gauge and fuse as the power-wire and distribution rules for the same figures', () => {
		// One computation: the calculator's inputs (45 A, own fuse 60 A, 3.5 m run, 0.5 m ground) on every screen
		const wire = powerWire({ currentA: 45, powerLengthM: 3.5, groundLengthM: 0.5, ownFuseA: 60 });
		const plan = distributionPlan({ amps: [{ currentA: 45, fuseA: 60 }], mainLengthM: 3.5, groundLengthsM: [0.5] });
		const sheet = jobSheet({ content: page(), parts: [], typedAmps: [{ currentA: 45, fuseA: 60 }], powerM: 3.5, groundM: 0.5 });
		// by hand: 4 m = 13.12 ft; 10.75 × 45 × 13.12 / 0.36 = 17,634 cmil → 6 AWG (24,538); fuse ≥ max(56.25, 60) → 60 A
		expect(wire.ok && [wire.awg, wire.fuseA]).toEqual(['6', 60]);
		expect(plan.ok && [plan.main.awg, plan.main.fuseA]).toEqual(['6', 60]);
		expect(sheet.wire?.ok && [sheet.wire.awg, sheet.wire.fuseA]).toEqual(['6', 60]);
		expect(sheet.fuse?.fuseA).toBe(60);
	});

	it('works the whole sheet in CCA when asked, and prints it', () => {
		const sheet = jobSheet({ content: page(), parts: [amp], material: 'cca', remoteM: 4.8, speakerM: 4.8 });
		// 12,217 cmil for copper (above) / 0.629 = 19,423 cmil: 8 AWG (14,810) too little → 6 AWG (24,538)
		expect(sheet.wire).toMatchObject({ ok: true, awg: '6', material: 'cca' });
		expect(sheet.material).toBe('cca');
		expect(sheet.basis).toMatch(/copper-clad aluminium \(CCA\)/);
	});

	it('shows the final load on the subwoofer amplifier and the charging verdict', () => {
		const c = page();
		c.boot.alternatorCruiseA = 110;
		c.boot.alternatorIdleA = 65;
		const sub = { ...mono, rms4OhmW: 300, rms2OhmW: 500, rms1OhmW: 800, minLoadOhm: 1, bridgeable: false, bridgedRmsW: null } as Part;
		const sheet = jobSheet({ content: c, parts: [amp, sub], powerM: 2, groundM: 0.3, subwoofers: { drivers: { count: 1, coils: 2, ohmsPerCoil: 4 } }, vehicleLoadA: 25 });
		// Ohm's law: one dual 4 Ω coil driver wires as 2 Ω (coils in parallel) or 8 Ω (in series); on the mono amplifier (fewest channels)
		expect(sheet.load?.ampLabel).toBe('M1');
		expect(sheet.load?.options.map((o) => o.ohms)).toEqual([2, 8]);
		// 2 Ω is at or above the 1 Ω minimum and the maker rates 500 W there; 8 Ω has no rated figure, so 2 Ω is picked
		expect(sheet.load?.chosen).toBe(0);
		expect(sheet.load?.options[0].check).toMatchObject({ ok: true, ratedW: 500 });
		// charging, by hand: 25 A + 70.88 A = 95.88 A; 110 A at cruise leaves 14.1 A (more than a tenth, 11 A);
		// 65 A at idle falls 30.9 A short; the install's 70.9 A is over a fifth of 110 A, so the charging cables are upgraded (common practice)
		expect(sheet.charging?.verdict).toBe('short-at-idle');
		expect(sheet.charging?.headroomA).toBeCloseTo(14.12, 2);
		expect(sheet.charging?.upgrade).toHaveLength(3);
	});

	it('asks for what the charging budget needs', () => {
		expect(jobSheet({ content: page(), parts: [amp], powerM: 2 }).gaps.join(' ')).toMatch(/page records no alternator output/);
		const c = page();
		c.boot.alternatorCruiseA = 110;
		expect(jobSheet({ content: c, parts: [amp], powerM: 2 }).gaps.join(' ')).toMatch(/type the vehicle's own load/);
	});
});
