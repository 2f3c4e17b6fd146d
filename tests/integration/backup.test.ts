import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { QueryTypes } from 'sequelize';
import { closeDb, emptyDatabase, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { seatSpace } from '../helpers/places';
import { db } from '../../src/lib/server/db';
import { config, S3_FAKE_CREDENTIALS } from '../../src/lib/server/config';
import { emptyContent } from '../../src/lib/domain/content/schema';
import { createVehicle, revisionById, saveRevision } from '../../src/lib/server/services/revisions';
import { requireVehicle } from '../../src/lib/server/services/vehicles';
import { addPhotosToVehicle } from '../../src/lib/server/services/photos';
import { setReviewBeforeShow } from '../../src/lib/server/services/review';
import { forgetShopSettings } from '../../src/lib/server/services/settings';
import { usePhotoStore } from '../../src/lib/server/storage';
import { S3PhotoStore } from '../../src/lib/server/storage/s3';
import { startObjectStoreFake, type RunningObjectStoreFake } from '../../src/lib/server/storage/fake';
import { MANIFEST, restoreBackup, RestoreRefused, takeBackup } from '../../src/lib/server/maintenance/backup';

// A backup restored into an empty install holds every revision, photo, person and setting it was taken from.

const BUCKET = 'kickpanel-backup-test';
const dirs: string[] = [];
const tempDir = (prefix: string) => {
	const d = mkdtempSync(join(tmpdir(), prefix));
	dirs.push(d);
	return d;
};
let source: RunningObjectStoreFake;
let target: RunningObjectStoreFake;
const store = (fake: RunningObjectStoreFake) => ({ endpoint: fake.url, bucket: BUCKET, region: 'us-east-1', credentials: { ...S3_FAKE_CREDENTIALS }, forcePathStyle: true });

/** Every row of the tables a shop would miss, in a stable order, for comparing two databases. */
async function snapshot(): Promise<Record<string, unknown[]>> {
	const out: Record<string, unknown[]> = {};
	for (const table of ['users', 'vehicles', 'revisions', 'photos', 'revision_photos', 'settings', 'revision_origins', 'rendered_notes', 'audit_log']) {
		out[table] = await db().query(`SELECT * FROM ${table} ORDER BY 1, 2`, { type: QueryTypes.SELECT });
	}
	return out;
}


beforeAll(async () => {
	await freshDatabase('backup_src');
	forgetShopSettings();
	source = await startObjectStoreFake({ port: 0, directory: tempDir('kickpanel-s3-src-'), bucket: BUCKET });
	target = await startObjectStoreFake({ port: 0, directory: tempDir('kickpanel-s3-dst-'), bucket: BUCKET });
	usePhotoStore(new S3PhotoStore(store(source)));
});

afterAll(async () => {
	await source?.stop();
	await target?.stop();
	for (const d of dirs) rmSync(d, { recursive: true, force: true });
	await closeDb();
});

describe('backup and restore', () => {
	it('restores every revision, photo, person and setting into an empty install', async () => {
		const [editor, admin] = [await makeUser('editor'), await makeUser('admin')];
		const made = await createVehicle(emptyContent({ make: 'Ostrel', model: 'Keepsafe', yearFrom: 2011, yearTo: 2015, body: 'wagon' }), editor);
		const vehicle = await requireVehicle(made.slug);
		const first = (await revisionById(made.revisionId))!;
		const content = structuredClone(first.content);
		content.seats.spaces = [seatSpace('s1', 'driver', 410, 330, 95)];
		await saveRevision(vehicle.id, { baseRevisionId: first.id, content, summary: 'Seat measured' }, editor);
		const photo = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#6a5a4a' } }).jpeg().toBuffer();
		await addPhotosToVehicle(vehicle.id, [{ name: 'rail.jpg', bytes: photo }], { section: 'seats', caption: 'Seat rail', alt: 'Seat rail (sample photo)' }, editor);
		await setReviewBeforeShow(true, admin);
		const before = await snapshot();
		expect(before.revisions.length).toBe(3);
		expect(before.photos.length).toBe(1);

		const backups = tempDir('kickpanel-backups-');
		const { folder, manifest } = await takeBackup(backups, { db: config.db, s3: store(source) }, new Date('2026-12-05T06:30:12.345Z'));
		expect(folder.endsWith('2026-12-05T06-30-12Z')).toBe(true);
		expect(manifest.tables.revisions).toBe(3);
		// A display and a thumbnail rendition of the one photo.
		expect(manifest.photos.length).toBe(2);

		await emptyDatabase('backup_dst');
		const restored = await restoreBackup(folder, { db: config.db, s3: store(target) });
		expect(restored.photos).toBe(2);
		expect(await snapshot()).toEqual(before);
		// The photo objects are back in the new bucket, byte for byte.
		const restoredStore = new S3PhotoStore(store(target));
		for (const p of manifest.photos) expect((await restoredStore.head(p.key))?.bytes).toBe(p.bytes);
		restoredStore.close();

		// A second restore into the now full database is refused, and so is a backup with a changed photo.
		await expect(restoreBackup(folder, { db: config.db, s3: store(target) })).rejects.toBeInstanceOf(RestoreRefused);
		await emptyDatabase('backup_dst2');
		writeFileSync(join(folder, 'photos', manifest.photos[0].key), 'not the photo');
		await expect(restoreBackup(folder, { db: config.db, s3: store(target) })).rejects.toThrow(/does not match the backup's manifest/);
		expect(readdirSync(folder)).toContain(MANIFEST);
	}, 120_000);
});
