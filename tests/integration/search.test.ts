import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { parseContent, type VehicleContent } from '../../src/lib/domain/content/schema';
import { checkDigit } from '../../src/lib/domain/vin';
import type { SessionUser } from '../../src/lib/domain/sessionUser';
import { LiveSearchIndex, searchIndex, stopSearchIndex } from '../../src/lib/server/search';
import { createVehicle, restoreRevision, revisionById, saveRevision, setRevisionHidden } from '../../src/lib/server/services/revisions';
import { vehicleBySlug } from '../../src/lib/server/services/vehicles';
import { ServiceError } from '../../src/lib/server/errors';
import { lookupVin } from '../../src/lib/server/vin/lookup';
import { fakeDecode } from '../../src/lib/server/vin/fake';
import type { DecodeResult } from '../../src/lib/server/vin/client';
import { GET as searchEndpoint } from '../../src/routes/api/search/+server';
import { GET as vinEndpoint } from '../../src/routes/api/vin/[vin]/+server';

// Sample data: the invented sample pages.
const samples: VehicleContent[] = JSON.parse(readFileSync(new URL('../../content-seed/vehicles.json', import.meta.url), 'utf8')).vehicles.map(
	(v: unknown) => parseContent(v).data!
);
const sample = (model: string) => structuredClone(samples.find((v) => v.identity.model === model)!);

let writer: SessionUser;
let moderator: SessionUser;
let viewer: SessionUser;
let live: LiveSearchIndex;
const TARN = 'veldra-tarn-2009-2013-sedan';

async function current(slug: string) {
	const found = await vehicleBySlug(slug);
	if (!found || !('vehicle' in found)) throw new Error(`no page ${slug}`);
	return { vehicle: found.vehicle, rev: (await revisionById(found.vehicle.latestRevisionId!))! };
}
const find = async (index: LiveSearchIndex, q: string) => (await index.search({ q, conditions: [] }, { limit: 20 })).items.map((h) => h.slug);

beforeAll(async () => {
	await freshDatabase('search');
	writer = await makeUser('editor');
	moderator = await makeUser('moderator');
	viewer = await makeUser('viewer');
	for (const model of ['Tarn', 'Bristle', 'Pennick']) await createVehicle(sample(model), writer);
	live = new LiveSearchIndex();
	live.start({ pollMs: 0, listen: true });
	await live.ready();
});
afterAll(async () => {
	live.stop();
	stopSearchIndex();
	await closeDb();
});

describe('the index built from MariaDB', () => {
	it('holds every page at its latest revision', async () => {
		expect(live.status()).toMatchObject({ state: 'ready', pages: 3 });
		expect(await find(live, '2012 tarn')).toEqual([TARN]);
		expect(await find(live, 'tarn 12')).toEqual([TARN]);
	});

	it('cuts snippets from the page text', async () => {
		const out = await live.search({ q: 'occupant sensor', conditions: [] }, { limit: 5 });
		expect(out.items[0]).toMatchObject({ slug: TARN, section: 'seats' });
		expect(out.items[0].snippet).toContain('Occupant sensor');
		expect(out.tookMs).toBeGreaterThanOrEqual(0);
	});

	it('takes in a new page in the request that creates it', async () => {
		await createVehicle(sample('Sallow'), writer);
		expect(await find(live, 'sallow')).toEqual(['brenmoor-sallow-2011-2017-wagon']);
	});
});

describe('staying consistent with saves, restores and hides', () => {
	const marker = 'quillfeather';
	let withMarker = 0;

	it('finds a word in the request that saves it', async () => {
		const { vehicle, rev } = await current(TARN);
		const content = structuredClone(rev.content);
		content.dash.notes += `\n\nThe ${marker} clip hides behind the vent.`;
		const saved = await saveRevision(vehicle.id, { baseRevisionId: rev.id, content, summary: 'dash clip' }, writer);
		withMarker = saved.revisionId;
		const out = await live.search({ q: marker, conditions: [] }, { limit: 5 });
		expect(out.items.map((h) => [h.slug, h.section])).toEqual([[TARN, 'dash']]);
	});

	it('forgets it when the next revision removes it, and a hidden old revision stays unsearchable', async () => {
		const { vehicle, rev } = await current(TARN);
		const content = structuredClone(rev.content);
		content.dash.notes = content.dash.notes.replace(`\n\nThe ${marker} clip hides behind the vent.`, '');
		await saveRevision(vehicle.id, { baseRevisionId: rev.id, content, summary: 'removed the clip note' }, writer);
		expect(await find(live, marker)).toEqual([]);
		await setRevisionHidden(withMarker, true, 'test: customer details', moderator);
		expect(await find(live, marker)).toEqual([]);
		expect(await find(live, '2012 tarn')).toEqual([TARN]);
	});

	it('finds it again once a moderator restores that revision (after unhiding it)', async () => {
		const { vehicle } = await current(TARN);
		await setRevisionHidden(withMarker, false, 'test', moderator);
		await restoreRevision(vehicle.id, withMarker, moderator);
		expect(await find(live, marker)).toEqual([TARN]);
	});

	it('follows a renamed model: the new name is found, the old one is not', async () => {
		const { vehicle, rev } = await current('korvane-pennick-2003-2008-pickup');
		const content = structuredClone(rev.content);
		content.identity.model = 'Pennock';
		const saved = await saveRevision(vehicle.id, { baseRevisionId: rev.id, content, summary: 'model name' }, writer);
		expect(await find(live, 'pennock')).toEqual([saved.slug]);
		// the old name is gone from the index: it is now only a slip for the new one
		const old = await live.search({ q: 'pennick', conditions: [] }, { limit: 5 });
		expect(old.corrections).toEqual([{ from: 'pennick', to: 'pennock' }]);
	});
});

describe('a second app instance', () => {
	it('catches up by polling for revisions it did not write', async () => {
		const other = new LiveSearchIndex();
		other.start({ pollMs: 0, listen: false });
		await other.ready();
		other.stop();
		const { vehicle, rev } = await current('korvane-bristle-2016-2022-suv');
		const content = structuredClone(rev.content);
		content.removal.notes += '\n\nA brasswick screw holds the lower trim.';
		await saveRevision(vehicle.id, { baseRevisionId: rev.id, content, summary: 'trim screw' }, writer);
		// This instance wrote it and knows at once; the other one only after its next poll.
		expect(await find(live, 'brasswick')).toEqual(['korvane-bristle-2016-2022-suv']);
		expect(await find(other, 'brasswick')).toEqual([]);
		expect(await other.catchUp()).toBe(1);
		expect(await find(other, 'brasswick')).toEqual(['korvane-bristle-2016-2022-suv']);
		expect(await other.catchUp()).toBe(0);
	});
});

describe('VIN lookup', () => {
	const vinFor = (start: string, year: string) => {
		const body = (start + 'A7B8C9D0E1F2G3H4J').slice(0, 17).split('');
		body[6] = 'A';
		body[9] = year;
		body[8] = '0';
		body[8] = checkDigit(body.join(''));
		return body.join('');
	};
	const fake = async (vin: string): Promise<DecodeResult> => {
		const v = fakeDecode(vin).vehicles[0];
		return v ? { status: 'found', vehicle: v } : { status: 'unknown' };
	};

	it('leads from a VIN pattern on the page to the page, within its years', async () => {
		const found = await lookupVin(vinFor('VD1TN', 'C'), fake);
		expect(found).toMatchObject({ valid: true, modelYear: 2012, wmi: 'VD1', decoded: { make: 'Veldra', model: 'Tarn' }, newPage: null });
		expect(found.matches.map((m) => [m.slug, m.reason])).toEqual([[TARN, 'vin-pattern']]);
		expect((await lookupVin(vinFor('VD1TN', 'G'), fake)).matches).toEqual([]);
	});

	it('offers a new page when no page covers the decoded vehicle', async () => {
		const found = await lookupVin(vinFor('AB3FW', 'F'), fake);
		expect(found.matches).toEqual([]);
		expect(found.newPage).toEqual({ make: 'Ambrel', model: 'Fenwick', year: 2015 });
	});

	it('still answers when the decoder is down', async () => {
		const found = await lookupVin(vinFor('VD1TN', 'C'), async () => ({ status: 'unavailable', reason: 'no answer within 2 s' }));
		expect(found.decoded).toBeNull();
		expect(found.decoder.message).toMatch(/unavailable \(no answer within 2 s\)/);
		expect(found.matches.map((m) => m.slug)).toEqual([TARN]);
	});

	it('says what is wrong with a mistyped North American VIN', async () => {
		// 49 CFR 565 makes the check digit mandatory where the VIN starts 1–5 (ISO 3780 North America)
		const good = vinFor('1D1TN', 'C');
		const typo = good.slice(0, 12) + (good[12] === '7' ? '8' : '7') + good.slice(13);
		const found = await lookupVin(typo, fake);
		expect(found.valid).toBe(false);
		expect(found.problem).toMatch(/Check digit \(position 9\)/);
		// ISO 3779: outside North America position 9 is the maker's, so the same slip is no problem there
		const elsewhere = vinFor('VD1TN', 'C');
		expect((await lookupVin(elsewhere.slice(0, 12) + (elsewhere[12] === '7' ? '8' : '7') + elsewhere.slice(13), fake)).valid).toBe(true);
		await expect(lookupVin('VD1TN5A7', fake)).rejects.toThrow(/A VIN has 17 characters; this one has 8/);
		await expect(lookupVin('VD1TN5A7OCX123456', fake)).rejects.toMatchObject({ status: 400, message: expect.stringMatching(/I, O or Q/) });
		await expect(lookupVin('VD1TN5A7OCX123456', fake)).rejects.toBeInstanceOf(ServiceError);
	});
});

describe('the JSON endpoints', () => {
	const event = (path: string, user: SessionUser | null, params: Record<string, string> = {}) =>
		({ locals: { user, units: 'metric' }, url: new URL(`http://127.0.0.1${path}`), params }) as unknown as Parameters<typeof searchEndpoint>[0];

	it('answers a search with items, total and time taken', async () => {
		const res = await searchEndpoint(event('/api/search?q=2012+tarn&limit=5', viewer));
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.total).toBe(1);
		expect(body.items[0]).toMatchObject({ slug: TARN, title: 'Veldra Tarn 2009–2013', yearFrom: 2009, yearTo: 2013, body: 'sedan', section: 'identity' });
		expect(Object.keys(body.items[0])).toEqual(expect.arrayContaining(['slug', 'title', 'yearFrom', 'yearTo', 'body', 'snippet', 'section', 'score']));
		expect(typeof body.tookMs).toBe('number');
	});

	it.each([
		['/api/search?q=tarn&limit=500', /"limit" must be a whole number from 1 to 50/],
		['/api/search?q=tarn&year=12', /"year" must be a whole number from 1950 to 2100/],
		['/api/search?q=tarn&body=limo', /body style must be one of/],
		['/api/search?measure=dash-depth&value=-1', /more than 0/]
	])('refuses %s with a clear message', async (path, message) => {
		const res = await searchEndpoint(event(path, viewer));
		expect(res.status).toBe(400);
		expect((await res.json()).message).toMatch(message);
	});

	it('needs a signed-in user', async () => {
		const res = await searchEndpoint(event('/api/search?q=tarn', null));
		expect(res.status).toBe(401);
	});

	it('answers a VIN, and refuses one that cannot be a VIN', async () => {
		const bad = await vinEndpoint(event('/api/vin/VD1TN', viewer, { vin: 'VD1TN' }) as never);
		expect(bad.status).toBe(400);
		expect((await bad.json()).message).toBe('A VIN has 17 characters; this one has 5.');
		const withQ = await vinEndpoint(event('/api/vin/x', viewer, { vin: 'VD1TN5A7QCX123456' }) as never);
		expect(withQ.status).toBe(400);
		expect((await withQ.json()).message).toMatch(/never uses the letters I, O or Q .* found Q at position 9/);
		const good = await vinEndpoint(event('/api/vin/x', viewer, { vin: '1M8GDM9AXKP042788' }) as never);
		expect(good.status).toBe(200);
		const body = await good.json();
		// 49 CFR 565 worked example: check digit X, model year 1989
		expect(body).toMatchObject({ vin: '1M8GDM9AXKP042788', valid: true, checkDigit: { expected: 'X', actual: 'X' }, modelYear: 1989, wmi: '1M8', matches: [] });
		expect(body.newPageHref).toBeNull();
	});
});

describe('the shared index', () => {
	it('builds on first use and answers the same', async () => {
		expect(await find(searchIndex(), '2012 tarn')).toEqual([TARN]);
	});
});
