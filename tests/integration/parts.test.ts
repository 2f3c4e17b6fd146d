import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { AuditLog, Part as PartRow } from '../../src/lib/server/db/models';
import { createPart, deletePart, listParts, partById, partsByIds, samplePartInput, updatePart } from '../../src/lib/server/services/parts';
import { ServiceError } from '../../src/lib/server/errors';
import { readPartForm } from '../../src/lib/domain/partForm';
import type { SessionUser } from '../../src/lib/domain/sessionUser';
import { down, up } from '../../src/lib/server/db/migrations/2026-12-05T06-00-00_load_figures';

let moderator: SessionUser;
let admin: SessionUser;
let editor: SessionUser;
let viewer: SessionUser;

// Invented sample parts (content-seed/parts.json), not real products.
const sample = JSON.parse(readFileSync(new URL('../../content-seed/parts.json', import.meta.url), 'utf8')).parts as Record<string, unknown>[];

const amp = {
	kind: 'amplifier',
	sku: 'TEST-AMP-1',
	name: 'Test four-channel',
	lengthMm: 200,
	widthMm: 140,
	heightMm: 45,
	channels: 4,
	rmsWattsPerChannel: 60,
	ampClass: 'D'
};

beforeAll(async () => {
	await freshDatabase('parts');
	moderator = await makeUser('moderator');
	admin = await makeUser('admin');
	editor = await makeUser('editor');
	viewer = await makeUser('viewer');
});
afterAll(() => closeDb());

describe('parts catalogue', () => {
	it('loads every sample part', async () => {
		for (const p of sample) await createPart(samplePartInput(p), admin);
		const all = await listParts();
		expect(all).toHaveLength(sample.length);
		const micro = all.find((p) => p.sku === 'SMPL-4D-MICRO');
		expect(micro).toMatchObject({ kind: 'amplifier', lengthMm: 150, widthMm: 90, heightMm: 38, channels: 4, ampClass: 'D', efficiency: 0.82 });
		const unit = all.find((p) => p.sku === 'SMPL-H2S');
		expect(unit).toMatchObject({ kind: 'head-unit', dinSize: 2, chassisDepthMm: 95 });
	});

	it('filters by kind and by a search for SKU or name', async () => {
		const speakers = await listParts({ kind: 'speaker' });
		expect(speakers.length).toBe(sample.filter((p) => p.kind === 'speaker').length);
		expect(speakers.every((p) => p.kind === 'speaker')).toBe(true);
		expect((await listParts({ q: 'micro' })).map((p) => p.sku)).toEqual(['SMPL-4D-MICRO']);
		// "%" is matched literally, not as a wildcard
		expect(await listParts({ q: '%' })).toEqual([]);
	});

	it('creates, reads, updates and deletes with an audit entry for each', async () => {
		const created = await createPart(amp, moderator);
		expect(created.id).toBeGreaterThan(0);
		expect(await partById(created.id)).toEqual(created);
		const updated = await updatePart(created.id, { ...amp, name: 'Test four-channel, revised', heightMm: 48 }, moderator);
		expect(updated).toMatchObject({ name: 'Test four-channel, revised', heightMm: 48, efficiency: null });
		expect((await partsByIds([created.id, 999_999, created.id])).map((p) => p.id)).toEqual([created.id]);
		await deletePart(created.id, admin);
		expect(await partById(created.id)).toBeNull();
		const actions = (await AuditLog.findAll({ where: { targetType: 'part', targetId: String(created.id) }, order: [['id', 'ASC']] })).map((a) => a.action);
		expect(actions).toEqual(['part.create', 'part.update', 'part.delete']);
	});

	it('refuses an editor or a viewer, and writes nothing', async () => {
		const before = await PartRow.count();
		for (const user of [editor, viewer]) {
			await expect(createPart({ ...amp, sku: 'NOPE-1' }, user)).rejects.toMatchObject({ status: 403 });
		}
		const existing = (await listParts())[0];
		await expect(updatePart(existing.id, { ...amp, sku: existing.sku }, editor)).rejects.toMatchObject({ status: 403 });
		await expect(deletePart(existing.id, viewer)).rejects.toMatchObject({ status: 403 });
		expect(await PartRow.count()).toBe(before);
	});

	it('answers a duplicate SKU on its field, whatever the letter case', async () => {
		const err = await createPart({ ...amp, sku: 'smpl-4d' }, moderator).catch((e) => e);
		expect(err).toBeInstanceOf(ServiceError);
		expect(err.status).toBe(409);
		expect(err.fieldErrors).toEqual({ sku: 'Another part already has the SKU "smpl-4d".' });
	});

	it('answers bad input with a message per field', async () => {
		const err = await createPart({ ...amp, sku: 'OK-1', lengthMm: -3, channels: 2.5 }, moderator).catch((e) => e);
		expect(err.status).toBe(400);
		expect(err.fieldErrors).toMatchObject({ lengthMm: 'Length must be more than 0 mm.', channels: 'Channels must be a whole number.' });
		const missing = await createPart({ kind: 'speaker', sku: 'SPK-1', name: 'A speaker' }, moderator).catch((e) => e);
		expect(Object.keys(missing.fieldErrors)).toEqual(expect.arrayContaining(['cutoutMm', 'mountingDepthMm']));
		await expect(updatePart(999_999, amp, moderator)).rejects.toMatchObject({ status: 404 });
	});

	it('reads the catalogue form with inches and keeps one message per field', () => {
		// 7.87 in × 25.4 = 199.898 mm (international inch, exact by definition)
		const ok = readPartForm({ kind: 'enclosure', sku: 'BOX-1', name: 'Box', lengthMm: '7.87 in', widthMm: '140', heightMm: '45 mm' });
		expect(ok.ok && ok.part).toMatchObject({ lengthMm: 199.898, widthMm: 140, heightMm: 45 });
		const bad = readPartForm({ kind: 'enclosure', sku: '', name: 'Box', lengthMm: 'long', widthMm: '', heightMm: '45' });
		expect(bad.ok).toBe(false);
		if (!bad.ok) {
			expect(bad.errors.sku).toMatch(/SKU/);
			expect(bad.errors.lengthMm).toMatch(/Could not read "long" as a length/);
			expect(bad.errors.widthMm).toBe('Width is required for this kind of part.');
		}
	});
});

describe('load figures on older parts', () => {
	it('reads a speaker entered with one impedance as one coil at that impedance, and goes back', async () => {
		const now = new Date();
		const base = { lengthMm: null, widthMm: null, heightMm: null, notes: '', createdAt: now, updatedAt: now };
		const old = await PartRow.create({ ...base, kind: 'speaker', sku: 'OLD-SPK', name: 'Older speaker', specs: JSON.stringify({ cutoutMm: 142, mountingDepthMm: 58, impedanceOhm: 4 }) });
		const oldAmp = await PartRow.create({
			...base,
			kind: 'amplifier',
			sku: 'OLD-AMP',
			name: 'Older amp',
			lengthMm: 200,
			widthMm: 140,
			heightMm: 45,
			specs: JSON.stringify({ channels: 2, rmsWattsPerChannel: 75, ampClass: 'D', efficiency: null, fuseRatingA: null })
		});
		const context = PartRow.sequelize!.getQueryInterface();
		await up({ context, name: 'load figures', path: undefined });
		const specs = async (id: number) => JSON.parse((await PartRow.findByPk(id))!.specs);
		expect(await specs(old.id)).toMatchObject({ voiceCoils: 1, ohmsPerCoil: 4 });
		expect(await specs(oldAmp.id)).toMatchObject({ bridgeable: false, minLoadOhm: null, rms4OhmW: null });
		expect(await partById(old.id)).toMatchObject({ voiceCoils: 1, ohmsPerCoil: 4 });
		await down({ context, name: 'load figures', path: undefined });
		expect(await specs(old.id)).toEqual({ cutoutMm: 142, mountingDepthMm: 58, impedanceOhm: 4 });
		expect(await specs(oldAmp.id)).not.toHaveProperty('bridgeable');
	});
});
