import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { canonicalJson, formatZodIssues, parseContent, type VehicleContent } from '../../../src/lib/domain/content/schema';
import { ROLES } from '../../../src/lib/domain/roles';

const read = (name: string) => JSON.parse(readFileSync(new URL(`../../../content-seed/${name}`, import.meta.url), 'utf8'));

const vehiclesFile = read('vehicles.json') as { sample: boolean; note: string; vehicles: unknown[] };
const shopFile = read('shop.json');
const usersFile = read('users.json');
const partsFile = read('parts.json');

const vehicles: VehicleContent[] = vehiclesFile.vehicles.map((v) => {
	const r = parseContent(v);
	if (!r.success) throw new Error(`${JSON.stringify((v as VehicleContent).identity?.model)}: ${JSON.stringify(formatZodIssues(r.error))}`);
	return r.data;
});

describe('seed files are marked as sample data', () => {
	it.each([
		['vehicles.json', vehiclesFile],
		['shop.json', shopFile],
		['users.json', usersFile],
		['parts.json', partsFile]
	])('%s', (_name, file) => {
		expect(file.sample).toBe(true);
		expect(file.note).toMatch(/^Sample data/);
	});
});

describe('seed vehicles', () => {
	it('are at least 14 and every one passes the schema', () => {
		expect(vehiclesFile.vehicles.length).toBeGreaterThanOrEqual(14);
		expect(vehicles).toHaveLength(vehiclesFile.vehicles.length);
	});

	it('are stored exactly as the schema reads them', () => {
		vehiclesFile.vehicles.forEach((raw, i) => expect(canonicalJson(raw)).toBe(canonicalJson(vehicles[i])));
	});

	it('each say in their identity notes that they are sample data', () => {
		for (const v of vehicles) expect(v.identity.notes).toMatch(/^Sample data/);
	});

	it('are distinct pages', () => {
		const keys = vehicles.map((v) => `${v.identity.make}|${v.identity.model}|${v.identity.yearFrom}`);
		expect(new Set(keys).size).toBe(keys.length);
	});

	it('include a Tarn whose years cover 2012', () => {
		const tarn = vehicles.filter((v) => /\btarn\b/i.test(v.identity.model) && v.identity.yearFrom <= 2012 && 2012 <= v.identity.yearTo);
		expect(tarn.length).toBeGreaterThanOrEqual(1);
	});

	it('cover every seat, with some heights not measured', () => {
		const spaces = vehicles.flatMap((v) => v.seats.spaces);
		expect(new Set(spaces.map((s) => s.seat))).toEqual(new Set(['driver', 'passenger', 'rear']));
		expect(spaces.some((s) => s.heightMm === null)).toBe(true);
		expect(vehicles.some((v) => v.seats.spaces.length === 3 && v.seats.spaces.every((s) => s.heightMm !== null))).toBe(true);
	});

	it('vary how fully they are documented', () => {
		const filled = (v: VehicleContent) =>
			[v.power.runs, v.firewall.passages, v.seats.spaces, v.harness.wires, v.harness.ladder.lines, v.speakers.locations, v.camera.feeds].filter(
				(l) => l.length > 0
			).length;
		const counts = vehicles.map(filled);
		expect(Math.max(...counts)).toBe(7);
		expect(Math.min(...counts)).toBeLessThanOrEqual(2);
	});

	it('use several dash openings and body styles', () => {
		expect(new Set(vehicles.map((v) => v.dash.opening)).size).toBeGreaterThanOrEqual(4);
		expect(new Set(vehicles.map((v) => v.identity.body)).size).toBeGreaterThanOrEqual(6);
	});

	it('have two steering lines of 4 to 6 buttons wherever a ladder is recorded', () => {
		const withLadder = vehicles.filter((v) => v.harness.ladder.lines.length > 0);
		expect(withLadder.length).toBeGreaterThanOrEqual(8);
		for (const v of withLadder) {
			expect(v.harness.ladder.lines).toHaveLength(2);
			for (const line of v.harness.ladder.lines) {
				expect(line.buttons.length).toBeGreaterThanOrEqual(4);
				expect(line.buttons.length).toBeLessThanOrEqual(6);
				for (const b of line.buttons) expect(b.ohms).not.toBeNull();
			}
		}
	});

	it('carry the usual cautions where power, drilling or airbags come up', () => {
		const all = vehicles.map((v) => [v.power.notes, v.firewall.notes, v.seats.notes, v.dash.notes].join('\n')).join('\n');
		expect(all).toMatch(/disconnect the battery/i);
		expect(all).toMatch(/fuse the power cable close to the battery/i);
		expect(all).toMatch(/check behind the panel before drilling/i);
		expect(all).toMatch(/airbag \(SRS\)/);
		expect(all).toMatch(/vehicle maker's procedures, local codes and licensed practice/);
	});

	// Common practice (from memory): a cone speaker's cut-out is a little under its nominal
	// size, e.g. about 140–150 mm for 6.5 in. Tweeters are named by dome size, so skipped.
	it('have speaker cut-outs that fit their nominal size', () => {
		const inch = 25.4; // exact by definition (1959 international yard and pound agreement)
		for (const s of vehicles.flatMap((v) => v.speakers.locations)) {
			const n = Number.parseFloat(s.nominalSize);
			if (s.cutoutMm === null || Number.isNaN(n) || /tweeter/.test(s.nominalSize)) continue;
			expect(s.cutoutMm).toBeLessThan(n * inch);
			expect(s.cutoutMm).toBeGreaterThan(n * inch * 0.75);
		}
	});
});

describe('seed shop and users', () => {
	it('has a named sample shop', () => {
		expect(shopFile.shop.name).toMatch(/Sample/);
		expect(shopFile.shop.email).toMatch(/@kickpanel\.test$/);
	});

	it('has one demo user per role, with a password', () => {
		const users = usersFile.users as { email: string; name: string; role: string; password: string }[];
		expect(users.map((u) => u.role).sort()).toEqual([...ROLES].sort());
		for (const u of users) {
			expect(u.email).toMatch(/^[a-z]+@kickpanel\.test$/);
			expect(u.name.length).toBeGreaterThan(3);
			expect(u.password).toBe(`sample-${u.role}-pass`);
		}
	});
});

describe('seed parts', () => {
	const parts = partsFile.parts as Record<string, unknown>[];
	const positive = (v: unknown) => typeof v === 'number' && v > 0;

	it('has about a dozen parts of every kind, each with a unique sku', () => {
		expect(parts.length).toBeGreaterThanOrEqual(10);
		expect(new Set(parts.map((p) => p.kind))).toEqual(new Set(['amplifier', 'head-unit', 'speaker', 'enclosure']));
		expect(new Set(parts.map((p) => p.sku)).size).toBe(parts.length);
		for (const p of parts) expect(p.name).toMatch(/^Samplewick /);
	});

	it('gives amplifiers a box, channels, power and a class efficiency', () => {
		for (const a of parts.filter((p) => p.kind === 'amplifier')) {
			for (const k of ['lengthMm', 'widthMm', 'heightMm', 'channels', 'rmsWattsPerChannel']) expect(positive(a[k])).toBe(true);
			expect(['A/B', 'D']).toContain(a.class);
			// Common practice: class A/B near 50–65 %, class D near 80–90 %.
			const [lo, hi] = a.class === 'D' ? [0.75, 0.95] : [0.45, 0.7];
			expect(a.efficiency).toBeGreaterThanOrEqual(lo);
			expect(a.efficiency).toBeLessThanOrEqual(hi);
		}
	});

	// ISO 7736 (from memory): a DIN head unit is 180 × 50 mm, double DIN 180 × 100 mm.
	it('sizes head units to their DIN height', () => {
		for (const h of parts.filter((p) => p.kind === 'head-unit')) {
			expect([1, 2]).toContain(h.dinSize);
			expect(h.heightMm).toBe(50 * (h.dinSize as number));
			expect(h.widthMm as number).toBeLessThanOrEqual(180);
			expect(positive(h.chassisDepthMm)).toBe(true);
		}
	});

	it('gives speakers a cut-out, depth and impedance, and enclosures a box', () => {
		for (const s of parts.filter((p) => p.kind === 'speaker')) {
			for (const k of ['cutoutMm', 'mountingDepthMm', 'impedanceOhm']) expect(positive(s[k])).toBe(true);
			expect(s.nominalSize).toMatch(/^\d+(\.\d+)? in$/);
		}
		for (const e of parts.filter((p) => p.kind === 'enclosure')) {
			for (const k of ['lengthMm', 'widthMm', 'heightMm']) expect(positive(e[k])).toBe(true);
		}
	});
});
