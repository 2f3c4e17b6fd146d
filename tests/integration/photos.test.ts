import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { crc32, deflateSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import exifr from 'exifr';
import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import { createServer } from 'node:net';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { QueryTypes } from 'sequelize';
import { db } from '../../src/lib/server/db';
import { Photo, Revision } from '../../src/lib/server/db/models';
import * as revisionPhotosMigration from '../../src/lib/server/db/migrations/2026-12-01T16-00-00_revision_photos';
import { emptyContent } from '../../src/lib/domain/content/schema';
import { compareRevisions, createVehicle, restoreRevision, revisionById, setProtection, setRevisionHidden } from '../../src/lib/server/services/revisions';
import { requireVehicle } from '../../src/lib/server/services/vehicles';
import {
	addPhotosToVehicle,
	editPhotoDetails,
	openRendition,
	removePhotoFromVehicle,
	photoVisibleTo,
	storePhoto
} from '../../src/lib/server/services/photos';
import { ServiceError } from '../../src/lib/server/errors';
import { photoStore, usePhotoStore, type PhotoStore } from '../../src/lib/server/storage';
import { S3PhotoStore } from '../../src/lib/server/storage/s3';
import { S3_FAKE_CREDENTIALS as FAKE_CREDENTIALS } from '../../src/lib/server/config';
import { startObjectStoreFake, type RunningObjectStoreFake } from '../../src/lib/server/storage/fake';
import type { SessionUser } from '../../src/lib/domain/sessionUser';

const BUCKET = 'kickpanel-photos-test';
let fake: RunningObjectStoreFake;
let fakeDir: string;
let lister: S3Client;
let editor: SessionUser;
let moderator: SessionUser;
let viewer: SessionUser;
let slug: string;
const puts: string[] = [];

/** Counts writes so a test can tell a second upload of the same bytes wrote nothing new. */
function counting(store: PhotoStore): PhotoStore {
	return {
		put: (key, bytes, type) => {
			puts.push(key);
			return store.put(key, bytes, type);
		},
		get: (key) => store.get(key),
		head: (key) => store.head(key)
	};
}

async function bucketKeys(): Promise<string[]> {
	const res = await lister.send(new ListObjectsV2Command({ Bucket: BUCKET }));
	return (res.Contents ?? []).map((o) => o.Key!).sort();
}

async function streamBytes(stream: ReadableStream<Uint8Array>): Promise<Buffer> {
	return Buffer.from(await new Response(stream).arrayBuffer());
}

let shade = 0;
/** A JPEG with noise, so every call gives different bytes. */
async function jpeg(width: number, height: number): Promise<Buffer> {
	shade = (shade + 37) % 256;
	return sharp({ create: { width, height, channels: 3, background: { r: shade, g: 90, b: 160 }, noise: { type: 'gaussian', mean: 120, sigma: 20 } } })
		.jpeg({ quality: 80 })
		.toBuffer();
}

function pngChunk(type: string, data: Buffer): Buffer {
	const length = Buffer.alloc(4);
	length.writeUInt32BE(data.length);
	const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
	const crc = Buffer.alloc(4);
	crc.writeUInt32BE(crc32(body));
	return Buffer.concat([length, body, crc]);
}

/**
 * A valid PNG that claims 20000 × 20000 pixels (400 MP) in a few tens of KB: one-bit grey rows of zeros
 * compress about a thousandfold. Layout per the PNG specification (ISO/IEC 15948): signature, IHDR, IDAT, IEND.
 */
function decompressionBomb(): Buffer {
	const side = 20_000;
	const ihdr = Buffer.alloc(13);
	ihdr.writeUInt32BE(side, 0);
	ihdr.writeUInt32BE(side, 4);
	ihdr[8] = 1; // bit depth
	ihdr[9] = 0; // greyscale
	const rowBytes = 1 + Math.ceil(side / 8); // filter byte + packed pixels
	const idat = deflateSync(Buffer.alloc(rowBytes * side), { level: 9 });
	return Buffer.concat([
		Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
		pngChunk('IHDR', ihdr),
		pngChunk('IDAT', idat),
		pngChunk('IEND', Buffer.alloc(0))
	]);
}

/** The chunks of a WebP file (RIFF container, per the WebP container specification). */
function webpChunks(file: Buffer): { fourcc: string; data: Buffer }[] {
	expect(file.toString('latin1', 0, 4)).toBe('RIFF');
	expect(file.toString('latin1', 8, 12)).toBe('WEBP');
	const chunks: { fourcc: string; data: Buffer }[] = [];
	let at = 12;
	while (at + 8 <= file.length) {
		const fourcc = file.toString('latin1', at, at + 4);
		const size = file.readUInt32LE(at + 4);
		chunks.push({ fourcc, data: file.subarray(at + 8, at + 8 + size) });
		at += 8 + size + (size % 2);
	}
	return chunks;
}

/** GPS from a WebP's EXIF chunk as exifr reads it (exifr has no WebP parser, but reads the TIFF block inside). */
async function webpGps(file: Buffer): Promise<{ latitude: number; longitude: number } | undefined> {
	const exif = webpChunks(file).find((c) => c.fourcc === 'EXIF');
	if (!exif) return undefined;
	const tiff = exif.data.toString('latin1', 0, 6) === 'Exif\0\0' ? exif.data.subarray(6) : exif.data;
	return exifr.gps(tiff);
}

/** A JPEG carrying EXIF GPS (51° 30′ N, 0° 7′ W) and orientation 6 ("rotate 90° clockwise to view"). */
async function jpegWithGps(): Promise<Buffer> {
	return sharp({ create: { width: 800, height: 600, channels: 3, background: '#5a6b7c', noise: { type: 'gaussian', mean: 100, sigma: 15 } } })
		.withExif({
			IFD0: { ImageDescription: 'Sample data: invented vehicle' },
			IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 0/1' }
		})
		.withMetadata({ orientation: 6 })
		.jpeg()
		.toBuffer();
}

async function current() {
	const vehicle = await requireVehicle(slug);
	const rev = await revisionById(vehicle.latestRevisionId!);
	return { vehicle, rev: rev! };
}

const seatDetails = { section: 'seats', caption: 'Rail bolts under the passenger seat', alt: 'Passenger seat rail with two bolts and a loom clip' };

beforeAll(async () => {
	await freshDatabase('photos');
	fakeDir = mkdtempSync(join(tmpdir(), 'kickpanel-s3-'));
	fake = await startObjectStoreFake({ port: 0, directory: fakeDir, bucket: BUCKET });
	const config = { endpoint: fake.url, bucket: BUCKET, region: 'us-east-1', credentials: { ...FAKE_CREDENTIALS }, forcePathStyle: true };
	usePhotoStore(counting(new S3PhotoStore(config)));
	lister = new S3Client({ endpoint: fake.url, region: 'us-east-1', forcePathStyle: true, credentials: { ...FAKE_CREDENTIALS } });
	editor = await makeUser('editor');
	moderator = await makeUser('moderator');
	viewer = await makeUser('viewer');
	const created = await createVehicle(emptyContent({ make: 'Tarnell', model: 'Brisk', yearFrom: 2010, yearTo: 2014, body: 'hatchback' }), editor);
	slug = created.slug;
});

afterAll(async () => {
	lister?.destroy();
	await fake?.stop();
	if (fakeDir) rmSync(fakeDir, { recursive: true, force: true });
	await closeDb();
});

describe('storing a photo', () => {
	it('keeps a JPEG as WebP display and thumbnail renditions under the sha256 of its bytes', async () => {
		const bytes = await jpeg(2400, 1800);
		const photo = await storePhoto(bytes, editor, 'seat.jpg');
		// Reference digest from node:crypto (SHA-256, FIPS 180-4).
		expect(photo.id).toBe(createHash('sha256').update(bytes).digest('hex'));
		expect(photo).toMatchObject({ sha256: photo.id, mime: 'image/jpeg', width: 2400, height: 1800, bytes: bytes.length, uploaderId: editor.id });
		expect(await bucketKeys()).toEqual(expect.arrayContaining([`photos/${photo.id}/display.webp`, `photos/${photo.id}/thumb.webp`]));

		const display = await openRendition(photo.id, 'display');
		expect(display?.contentType).toBe('image/webp');
		const displayMeta = await sharp(await streamBytes(display!.body)).metadata();
		// Long side scaled to 1600 px, the other side in proportion: 1800 × 1600 / 2400 = 1200.
		expect([displayMeta.format, displayMeta.width, displayMeta.height]).toEqual(['webp', 1600, 1200]);
		const thumbMeta = await sharp(await streamBytes((await openRendition(photo.id, 'thumb'))!.body)).metadata();
		// 400 px long side: 1800 × 400 / 2400 = 300.
		expect([thumbMeta.format, thumbMeta.width, thumbMeta.height]).toEqual(['webp', 400, 300]);
	});

	it('does not enlarge a small photo', async () => {
		const photo = await storePhoto(await jpeg(320, 240), editor, 'small.jpg');
		const meta = await sharp(await streamBytes((await openRendition(photo.id, 'display'))!.body)).metadata();
		expect([meta.width, meta.height]).toEqual([320, 240]);
	});

	it('stores the same bytes once: one row and one set of objects', async () => {
		const bytes = await jpeg(1000, 750);
		const first = await storePhoto(bytes, editor, 'a.jpg');
		const putsAfterFirst = puts.length;
		const keysAfterFirst = await bucketKeys();
		const second = await storePhoto(Buffer.from(bytes), moderator, 'renamed-copy.jpg');
		expect(second.id).toBe(first.id);
		expect(second.uploaderId).toBe(editor.id);
		expect(await Photo.count({ where: { id: first.id } })).toBe(1);
		expect(puts.length).toBe(putsAfterFirst);
		expect(await bucketKeys()).toEqual(keysAfterFirst);
		expect(keysAfterFirst.filter((k) => k.startsWith(`photos/${first.id}/`))).toHaveLength(2);
	});

	it('reads the type from the bytes, not from the name', async () => {
		const png = await sharp({ create: { width: 300, height: 200, channels: 4, background: { r: 10, g: 200, b: 30, alpha: 0.5 } } }).png().toBuffer();
		const photo = await storePhoto(png, editor, 'looks-like.jpg');
		expect(photo.mime).toBe('image/png');
	});

	it('accepts AVIF, which the image library on this machine decodes', async () => {
		const avif = await sharp({ create: { width: 640, height: 480, channels: 3, background: '#aa5533' } }).avif().toBuffer();
		const photo = await storePhoto(avif, editor, 'dash.avif');
		expect([photo.mime, photo.width, photo.height]).toEqual(['image/avif', 640, 480]);
	});
});

describe('refusing what is not a usable photo, storing nothing', () => {
	const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script><rect width="10" height="10"/></svg>');
	const html = Buffer.from('<!DOCTYPE html><html><body><img src=x onerror="alert(1)"></body></html>');

	const cases: { what: string; name: string; bytes: () => Promise<Buffer>; status: number; message: RegExp }[] = [
		{ what: 'an HTML page renamed to .jpg', name: 'seat-rail.jpg', bytes: async () => html, status: 415, message: /“seat-rail\.jpg” was refused: it holds text .*whatever its name says/ },
		{ what: 'an SVG drawing', name: 'grommet.svg', bytes: async () => svg, status: 415, message: /“grommet\.svg” was refused: it holds text \(a web page or a drawing such as SVG\)/ },
		{
			what: 'a truncated JPEG',
			name: 'cut-short.jpg',
			bytes: async () => {
				const whole = await jpeg(600, 400);
				return whole.subarray(0, Math.floor(whole.length / 2));
			},
			status: 415,
			message: /“cut-short\.jpg” could not be read as an image: it looks damaged or cut short/
		},
		{ what: 'a zero-byte file', name: 'empty.jpg', bytes: async () => Buffer.alloc(0), status: 400, message: /“empty\.jpg” is empty \(0 bytes\)/ },
		{
			what: 'a file over the 15 MB limit',
			name: 'huge.jpg',
			bytes: async () => Buffer.concat([await jpeg(64, 64), Buffer.alloc(15 * 1024 * 1024)]),
			status: 413,
			message: /“huge\.jpg” is 15\.\d+ MB, over the 15 MB limit for one photo/
		},
		{
			what: 'a decompression bomb claiming 20000 × 20000 pixels',
			name: 'bomb.png',
			bytes: async () => decompressionBomb(),
			status: 413,
			message: /“bomb\.png” is 20000 × 20000 pixels \(400 megapixels\); Kickpanel reads photos up to 60 megapixels/
		},
		{
			what: 'a GIF',
			name: 'anim.gif',
			bytes: () => sharp({ create: { width: 40, height: 40, channels: 3, background: '#123456' } }).gif().toBuffer(),
			status: 415,
			message: /“anim\.gif” is a GIF file, not a photo Kickpanel accepts/
		}
	];

	for (const c of cases) {
		it(`refuses ${c.what} with a clear message`, async () => {
			const bytes = await c.bytes();
			if (c.name === 'bomb.png') expect(bytes.length).toBeLessThan(100_000);
			const photosBefore = await Photo.count();
			const revisionsBefore = await Revision.count();
			const keysBefore = await bucketKeys();
			const putsBefore = puts.length;

			const direct = await storePhoto(bytes, editor, c.name).catch((e) => e);
			expect(direct).toBeInstanceOf(ServiceError);
			expect(direct.status).toBe(c.status);
			expect(direct.message).toMatch(c.message);

			const { vehicle } = await current();
			const viaPage = await addPhotosToVehicle(vehicle.id, [{ name: c.name, bytes }], seatDetails, editor).catch((e) => e);
			expect(viaPage).toBeInstanceOf(ServiceError);
			expect(viaPage.status).toBe(c.status);

			const id = createHash('sha256').update(bytes).digest('hex');
			expect(await Photo.findByPk(id)).toBeNull();
			expect(await Photo.count()).toBe(photosBefore);
			expect(await Revision.count()).toBe(revisionsBefore);
			expect(await bucketKeys()).toEqual(keysBefore);
			expect(puts.length).toBe(putsBefore);
		});
	}

	it('refuses a HEIC photo with advice, since the image library here has no HEIC decoder', async () => {
		// An AVIF relabelled as HEIC (brand and codec boxes renamed): detected as HEIC, and not decodable here.
		const avif = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#c9783b' } }).avif().toBuffer();
		const heic = Buffer.from(avif.toString('latin1').replaceAll('avif', 'heic').replaceAll('av01', 'hvc1').replaceAll('av1C', 'hvcC'), 'latin1');
		const err = await storePhoto(heic, editor, 'IMG_0042.HEIC').catch((e) => e);
		expect(err).toBeInstanceOf(ServiceError);
		expect(err.status).toBe(415);
		expect(err.message).toMatch(/“IMG_0042\.HEIC” is a HEIC photo, which this server cannot read\. On the phone, share it as JPEG/);
		expect(await Photo.findByPk(createHash('sha256').update(heic).digest('hex'))).toBeNull();
	});

	it('answers plainly and records nothing while photo storage is down, and works again when it is back', async () => {
		const bytes = await jpeg(640, 480);
		// A page of its own, so the photo it ends with changes no other test's page.
		const own = await createVehicle(emptyContent({ make: 'Tarnell', model: 'Outage', yearFrom: 2015, yearTo: 2018, body: 'sedan' }), editor);
		const vehicle = await requireVehicle(own.slug);
		const revisionOf = async () => (await requireVehicle(own.slug)).latestRevisionId;
		const photosBefore = await Photo.count();
		const closed = createServer();
		await new Promise<void>((resolve) => closed.listen(0, '127.0.0.1', resolve));
		const deadPort = (closed.address() as { port: number }).port;
		await new Promise<void>((resolve) => closed.close(() => resolve()));
		const down = new S3PhotoStore({ endpoint: `http://127.0.0.1:${deadPort}`, bucket: BUCKET, region: 'us-east-1', credentials: { ...FAKE_CREDENTIALS }, forcePathStyle: true });
		const working = photoStore();
		usePhotoStore(down);
		try {
			const err = await addPhotosToVehicle(vehicle.id, [{ name: 'rail.jpg', bytes }], seatDetails, editor).catch((e) => e);
			expect(err).toBeInstanceOf(ServiceError);
			expect(err.status).toBe(503);
			expect(err.message).toMatch(/Photo storage is not answering right now, so nothing was uploaded/);
			expect(await Photo.count()).toBe(photosBefore);
			expect(await revisionOf()).toBe(own.revisionId);
		} finally {
			usePhotoStore(working);
			down.close();
		}
		await addPhotosToVehicle(vehicle.id, [{ name: 'rail.jpg', bytes }], seatDetails, editor);
		expect(await Photo.count()).toBe(photosBefore + 1);
	});

	it('refuses a whole upload when one of its files is bad, and stores none of them', async () => {
		const good = await jpeg(800, 600);
		const { vehicle, rev } = await current();
		const keysBefore = await bucketKeys();
		const err = await addPhotosToVehicle(
			vehicle.id,
			[
				{ name: 'good.jpg', bytes: good },
				{ name: 'page.jpg', bytes: html }
			],
			seatDetails,
			editor
		).catch((e) => e);
		expect(err).toBeInstanceOf(ServiceError);
		expect(err.status).toBe(415);
		expect(err.message).toMatch(/^1 of 2 files was refused, so nothing was uploaded\. “page\.jpg” was refused/);
		expect(await Photo.findByPk(createHash('sha256').update(good).digest('hex'))).toBeNull();
		expect(await bucketKeys()).toEqual(keysBefore);
		expect((await current()).rev.id).toBe(rev.id);
	});

	it('asks for the section and a description before anything is stored', async () => {
		const { vehicle } = await current();
		const bytes = await jpeg(200, 150);
		const noAlt = await addPhotosToVehicle(vehicle.id, [{ name: 'x.jpg', bytes }], { section: 'seats', alt: '  ' }, editor).catch((e) => e);
		expect(noAlt.status).toBe(400);
		expect(noAlt.fieldErrors.alt).toMatch(/Describe what the photo shows/);
		const noSection = await addPhotosToVehicle(vehicle.id, [{ name: 'x.jpg', bytes }], { alt: 'A seat' }, editor).catch((e) => e);
		expect(noSection.status).toBe(400);
		expect(noSection.fieldErrors.section).toMatch(/Choose the section/);
		expect(await Photo.findByPk(createHash('sha256').update(bytes).digest('hex'))).toBeNull();
	});

	it('refuses a viewer, and an editor on a page protected for moderators, before reading the files', async () => {
		const { vehicle } = await current();
		const bytes = await jpeg(200, 150);
		const asViewer = await addPhotosToVehicle(vehicle.id, [{ name: 'x.jpg', bytes }], seatDetails, viewer).catch((e) => e);
		expect(asViewer.status).toBe(403);
		await setProtection(vehicle.id, 'moderators', moderator);
		const asEditor = await addPhotosToVehicle(vehicle.id, [{ name: 'x.jpg', bytes }], seatDetails, editor).catch((e) => e);
		expect(asEditor.status).toBe(403);
		expect(asEditor.message).toMatch(/locked for moderators/);
		await setProtection(vehicle.id, 'none', moderator);
		expect(await Photo.findByPk(createHash('sha256').update(bytes).digest('hex'))).toBeNull();
	});
});

describe('metadata and orientation', () => {
	it('leaves GPS and every other metadata block out of the stored renditions, and turns the photo upright', async () => {
		const source = await jpegWithGps();
		// The source really carries the position and the orientation flag (read back with exifr).
		const sourceGps = await exifr.gps(source);
		expect(sourceGps?.latitude).toBeCloseTo(51.5, 6); // 51° 30′ = 51.5°
		expect(sourceGps?.longitude).toBeCloseTo(-(7 / 60), 6); // 0° 7′ W = −0.11667°
		expect(await exifr.orientation(source)).toBe(6);

		// The WebP check can fail: a WebP made while keeping EXIF shows the GPS to the same reader.
		const leaky = await sharp(source).keepExif().webp().toBuffer();
		expect((await webpGps(leaky))?.latitude).toBeCloseTo(51.5, 6);

		const photo = await storePhoto(source, editor, 'with-gps.jpg');
		// Orientation 6 turns 800 × 600 stored pixels into a 600 × 800 upright photo (EXIF 2.32, CIPA DC-008, Orientation tag).
		expect([photo.width, photo.height]).toEqual([600, 800]);
		for (const rendition of ['display', 'thumb'] as const) {
			const bytes = await streamBytes((await openRendition(photo.id, rendition))!.body);
			expect(await webpGps(bytes)).toBeUndefined();
			const fourccs = webpChunks(bytes).map((c) => c.fourcc);
			expect(fourccs.filter((f) => !['VP8 ', 'VP8L', 'VP8X', 'ALPH'].includes(f))).toEqual([]);
			const meta = await sharp(bytes).metadata();
			expect(meta.exif).toBeUndefined();
			expect(meta.xmp).toBeUndefined();
			expect(meta.icc).toBeUndefined();
			expect(meta.height).toBeGreaterThan(meta.width);
		}
	});
});

describe('photos belong to revisions', () => {
	it('adds photos as one revision, edits and removes them as further revisions, and a restore brings a removed one back', async () => {
		const { vehicle, rev: start } = await current();
		const a = await jpeg(1200, 900);
		const b = await jpeg(900, 1200);
		const added = await addPhotosToVehicle(
			vehicle.id,
			[
				{ name: 'a.jpg', bytes: a },
				{ name: 'b.jpg', bytes: b }
			],
			seatDetails,
			editor
		);
		const [idA, idB] = added.photos.map((p) => p.id);
		const withBoth = await revisionById(added.revisionId);
		expect(withBoth!.parentId).toBe(start.id);
		expect(withBoth!.summary).toBe('Added 2 photos to Seat space');
		expect(withBoth!.sections).toContain('seats');
		expect(withBoth!.content.photos.map((p) => [p.id, p.section, p.alt])).toEqual([
			[idA, 'seats', seatDetails.alt],
			[idB, 'seats', seatDetails.alt]
		]);

		const again = await addPhotosToVehicle(vehicle.id, [{ name: 'a-again.jpg', bytes: a }], { ...seatDetails, section: 'dash' }, editor).catch((e) => e);
		expect(again.status).toBe(409);
		expect(again.message).toMatch(/“a-again\.jpg” is already on this page \(in Seat space\)/);

		const captioned = await editPhotoDetails(
			vehicle.id,
			idB,
			{ baseRevisionId: added.revisionId, details: { section: 'seats', caption: 'Loom clip to unhook first', alt: seatDetails.alt } },
			editor
		);
		expect((await revisionById(captioned.revisionId))!.summary).toBe("Changed a photo's caption in Seat space");

		const removed = await removePhotoFromVehicle(vehicle.id, idA, { baseRevisionId: captioned.revisionId }, editor);
		const afterRemove = await revisionById(removed.revisionId);
		expect(afterRemove!.summary).toBe('Removed a photo from Seat space');
		expect(afterRemove!.content.photos.map((p) => p.id)).toEqual([idB]);

		const cmp = await compareRevisions(vehicle.id, added.revisionId, removed.revisionId, moderator, 'metric');
		expect(cmp.photos.removed.map((p) => p.id)).toEqual([idA]);
		expect(cmp.photos.added).toEqual([]);
		expect(cmp.changes.some((c) => c.after === 'Loom clip to unhook first')).toBe(true);

		// Removing a photo from the page deletes nothing: its row and both renditions stay.
		expect(await Photo.findByPk(idA)).not.toBeNull();
		expect(await bucketKeys()).toEqual(expect.arrayContaining([`photos/${idA}/display.webp`, `photos/${idA}/thumb.webp`]));

		const restored = await restoreRevision(vehicle.id, added.revisionId, moderator);
		const back = await revisionById(restored.revisionId);
		expect(back!.restoresRevisionId).toBe(added.revisionId);
		expect(back!.content.photos.map((p) => p.id)).toEqual([idA, idB]);
		const served = await openRendition(idA, 'thumb');
		expect(served).not.toBeNull();
		expect((await sharp(await streamBytes(served!.body)).metadata()).format).toBe('webp');
	});

	it('stops showing readers a photo that is left only in hidden revisions, and shows it again when unhidden', async () => {
		const { vehicle, rev: before } = await current();
		const added = await addPhotosToVehicle(vehicle.id, [{ name: 'plate.jpg', bytes: await jpeg(640, 480) }], seatDetails, editor);
		const [id] = added.photos.map((p) => p.id);
		const otherViewer = await makeUser('viewer');
		expect(await photoVisibleTo(id, otherViewer)).toBe(true);

		// A moderator puts the page back and hides the revision that added the photo.
		await restoreRevision(vehicle.id, before.id, moderator);
		await setRevisionHidden(added.revisionId, true, 'shows a customer number plate', moderator);
		expect(await photoVisibleTo(id, otherViewer)).toBe(false);
		expect(await photoVisibleTo(id, moderator)).toBe(true);
		expect(await photoVisibleTo(id, editor)).toBe(true); // the one who uploaded it

		await setRevisionHidden(added.revisionId, false, 'plate blurred', moderator);
		expect(await photoVisibleTo(id, otherViewer)).toBe(true);
	});

	it('fills in which revisions show which photo for revisions written before that was recorded', async () => {
		const q = db().getQueryInterface();
		const recorded = await db().query('SELECT photo_id, revision_id FROM revision_photos ORDER BY photo_id, revision_id', { type: QueryTypes.SELECT });
		expect(recorded.length).toBeGreaterThan(0);
		await q.dropTable('revision_photos');
		await revisionPhotosMigration.up({ context: q } as Parameters<typeof revisionPhotosMigration.up>[0]);
		expect(await db().query('SELECT photo_id, revision_id FROM revision_photos ORDER BY photo_id, revision_id', { type: QueryTypes.SELECT })).toEqual(recorded);
	});

	it('moves a photo to another section as a revision', async () => {
		const { vehicle, rev } = await current();
		const photo = rev.content.photos[0];
		const moved = await editPhotoDetails(vehicle.id, photo.id, { baseRevisionId: rev.id, details: { ...photo, section: 'firewall' } }, editor);
		expect((await revisionById(moved.revisionId))!.summary).toBe('Moved a photo from Seat space to Firewall pass-through');
	});

	it('answers a photo no longer on the page with 404', async () => {
		const { vehicle, rev } = await current();
		const err = await removePhotoFromVehicle(vehicle.id, 'f'.repeat(64), { baseRevisionId: rev.id }, editor).catch((e) => e);
		expect(err.status).toBe(404);
	});
});
