import { Op } from 'sequelize';
import { z } from 'zod';
import { db } from '../db';
import { Photo } from '../db/models';
import { SECTION_KEYS, SECTION_NAMES, type Photo as PhotoEntry, type SectionKey, type VehicleContent } from '../../domain/content/schema';
import { roleAtLeast } from '../../domain/roles';
import type { SessionUser } from '../../domain/sessionUser';
import { photoStore } from '../storage';
import type { StoredObject } from '../storage/store';
import {
	checkSize,
	fileLabel,
	inspectUpload,
	renditionKey,
	RENDITIONS,
	RENDITION_TYPE,
	sha256Hex,
	type CheckedPhoto,
	type PhotoLimits,
	type Rendition
} from '../storage/renditions';
import { photoOpenTo } from './visibility';
import { canEditVehicle, revisionById, saveRevision, type StoredRevision } from './revisions';
import { vehicleById, type VehicleSummary } from './vehicles';
import { EditConflictError, ServiceError, fieldMessages } from '../errors';
import { config } from '../config';

export type PhotoRecord = {
	id: string;
	sha256: string;
	mime: string;
	width: number;
	height: number;
	bytes: number;
	uploaderId: number;
	createdAt: Date;
};

export type Upload = { name: string; bytes: Uint8Array };

export const MAX_FILES_PER_UPLOAD = 20;
// The content schema's own ceiling, checked before anything is stored.
const MAX_PHOTOS_PER_PAGE = 200;
const PHOTO_ID = /^[0-9a-f]{64}$/;

export const isPhotoId = (id: string): boolean => PHOTO_ID.test(id);
export const photoUrl = (id: string, rendition: Rendition = 'display'): string => `/photos/${id}/${rendition}`;

const sectionNames = SECTION_KEYS.map((k) => SECTION_NAMES[k]).join(', ');

export const photoDetailsSchema = z.object({
	section: z.enum(SECTION_KEYS, {
		error: (iss) => (iss.input === undefined || iss.input === '' ? 'Choose the section the photo belongs to.' : `The section must be one of: ${sectionNames}.`)
	}),
	caption: z
		.string({ error: 'The caption must be text.' })
		.trim()
		.max(300, { error: 'Keep the caption under 300 characters.' })
		.default(''),
	alt: z
		.string({ error: 'Describe what the photo shows, for people who cannot see it.' })
		.trim()
		.min(1, { error: 'Describe what the photo shows, for people who cannot see it (alt text).' })
		.max(300, { error: 'Keep the description under 300 characters.' })
});
export type PhotoDetails = z.output<typeof photoDetailsSchema>;

function parseDetails(input: unknown): PhotoDetails {
	const parsed = photoDetailsSchema.safeParse(input);
	if (!parsed.success) {
		const fields = fieldMessages(parsed.error);
		throw new ServiceError(Object.values(fields)[0], 400, fields);
	}
	return parsed.data;
}

function toRecord(row: Photo): PhotoRecord {
	return {
		id: row.id,
		sha256: row.id,
		mime: row.mime,
		width: row.width,
		height: row.height,
		bytes: row.bytes,
		uploaderId: row.uploaderId,
		createdAt: row.createdAt
	};
}

async function renditionsPresent(id: string): Promise<boolean> {
	const store = photoStore();
	const found = await Promise.all(RENDITIONS.map((r) => store.head(renditionKey(id, r))));
	return found.every((f) => f !== null);
}

/** Puts renditions that are not stored yet; the same key always carries the same bytes, so nothing is overwritten with anything new. */
async function putRenditions(checked: CheckedPhoto): Promise<void> {
	const store = photoStore();
	for (const r of RENDITIONS) {
		const key = renditionKey(checked.sha256, r);
		if (!(await store.head(key))) await store.put(key, checked.renditions[r], RENDITION_TYPE);
	}
}

type Checked = { name: string; id: string; known: PhotoRecord | null; checked: CheckedPhoto | null };

/** A photo stored before (row and renditions present) is not decoded again. */
async function checkOne(upload: Upload, limits: PhotoLimits): Promise<Checked> {
	checkSize(upload.bytes, upload.name, limits);
	const id = sha256Hex(upload.bytes);
	const row = await Photo.findByPk(id);
	if (row && (await renditionsPresent(id))) return { name: upload.name, id, known: toRecord(row), checked: null };
	const checked = await inspectUpload(upload.bytes, upload.name, limits);
	return { name: upload.name, id, known: row ? toRecord(row) : null, checked };
}

/** Every file is checked before any is stored; one refusal refuses the lot, with every reason. */
async function checkAll(uploads: Upload[]): Promise<Checked[]> {
	const limits = config.photos;
	const results: Checked[] = [];
	const refusals: ServiceError[] = [];
	const seen = new Set<string>();
	for (const upload of uploads) {
		try {
			const one = await checkOne(upload, limits);
			if (seen.has(one.id)) continue;
			seen.add(one.id);
			results.push(one);
		} catch (err) {
			if (!(err instanceof ServiceError)) throw err;
			refusals.push(err);
		}
	}
	if (refusals.length === 0) return results;
	if (uploads.length === 1) throw refusals[0];
	const count = refusals.length === 1 ? `1 of ${uploads.length} files was refused` : `${refusals.length} of ${uploads.length} files were refused`;
	const message = `${count}, so nothing was uploaded. ${refusals.map((r) => r.message).join(' ')}`;
	throw new ServiceError(message, refusals[0].status, { files: message });
}

/** Writes renditions, then the rows in one transaction; returns the rows in upload order. */
async function keep(items: Checked[], uploaderId: number): Promise<PhotoRecord[]> {
	for (const item of items) if (item.checked) await putRenditions(item.checked);
	const fresh = items.filter((i) => i.checked && !i.known).map((i) => i.checked!);
	if (fresh.length) {
		await db().transaction(async (transaction) => {
			await Photo.bulkCreate(
				fresh.map((c) => ({ id: c.sha256, mime: c.mime, width: c.width, height: c.height, bytes: c.bytes, uploaderId })),
				{ ignoreDuplicates: true, transaction }
			);
		});
	}
	const rows = await Photo.findAll({ where: { id: { [Op.in]: items.map((i) => i.id) } } });
	const byId = new Map(rows.map((r) => [r.id, toRecord(r)]));
	return items.map((i) => byId.get(i.id)!);
}

/**
 * Checks and keeps one image; the same bytes again answer the row already kept, with no second set of objects.
 * Throws a ServiceError (400 empty, 413 too large, 415 not an accepted image) and stores nothing when refused.
 */
export async function storePhoto(bytes: Uint8Array, uploader: Pick<SessionUser, 'id'>, name = ''): Promise<PhotoRecord> {
	const [item] = await checkAll([{ name, bytes }]);
	const [record] = await keep([item], uploader.id);
	return record;
}

async function editableVehicle(vehicleId: number, user: SessionUser, action: string): Promise<VehicleSummary> {
	if (!roleAtLeast(user.role, 'editor')) throw new ServiceError(`${action} needs the editor role.`, 403);
	const vehicle = await vehicleById(vehicleId);
	if (!vehicle) throw new ServiceError('That vehicle page no longer exists.', 404);
	if (!canEditVehicle(user, vehicle)) throw new ServiceError('This page is locked for moderators: only moderators can change its photos.', 403);
	return vehicle;
}

async function startingRevision(vehicle: VehicleSummary, baseRevisionId?: number): Promise<StoredRevision> {
	const id = baseRevisionId ?? vehicle.latestRevisionId;
	const rev = id ? await revisionById(id) : null;
	if (!rev || rev.vehicleId !== vehicle.id) {
		throw new ServiceError('The revision you started from is not part of this page. Reload the page and try again.', 400);
	}
	return rev;
}

/** Saves on top of `base`; a clash with someone else's change to the same photo becomes a plain message. */
async function savePhotos(vehicle: VehicleSummary, base: StoredRevision, content: VehicleContent, summary: string, author: SessionUser) {
	try {
		return await saveRevision(vehicle.id, { baseRevisionId: base.id, content, summary }, author);
	} catch (err) {
		if (err instanceof EditConflictError) {
			throw new ServiceError('Someone else changed this photo since you opened the page. Reload to see their change, then try again.', 409);
		}
		throw err;
	}
}

const photoCount = (n: number) => (n === 1 ? 'a photo' : `${n} photos`);

/**
 * Adds uploaded images to a page section as one new revision on top of the current one.
 * All or nothing: every file is checked first; nothing is stored when one is refused.
 */
export async function addPhotosToVehicle(
	vehicleId: number,
	uploads: Upload[],
	details: unknown,
	author: SessionUser
): Promise<{ revisionId: number; slug: string; photos: PhotoRecord[] }> {
	const vehicle = await editableVehicle(vehicleId, author, 'Adding photos');
	const { section, caption, alt } = parseDetails(details);
	if (uploads.length === 0) throw new ServiceError('Choose at least one photo to upload.', 400, { files: 'Choose at least one photo to upload.' });
	if (uploads.length > MAX_FILES_PER_UPLOAD) {
		const message = `Upload at most ${MAX_FILES_PER_UPLOAD} photos at a time; you chose ${uploads.length}.`;
		throw new ServiceError(message, 400, { files: message });
	}
	const base = await startingRevision(vehicle);
	const items = await checkAll(uploads);

	const onPage = new Map(base.content.photos.map((p) => [p.id, p]));
	const already = items.filter((i) => onPage.has(i.id));
	if (already.length) {
		const where = (i: Checked) => `${fileLabel(i.name)} is already on this page (in ${SECTION_NAMES[onPage.get(i.id)!.section]}).`;
		throw new ServiceError(`${already.map(where).join(' ')} Nothing was uploaded.`, 409);
	}
	if (base.content.photos.length + items.length > MAX_PHOTOS_PER_PAGE) {
		throw new ServiceError(`A page holds at most ${MAX_PHOTOS_PER_PAGE} photos; this one has ${base.content.photos.length}.`, 400);
	}

	const photos = await keep(items, author.id);
	const content = structuredClone(base.content);
	for (const p of photos) content.photos.push({ id: p.id, section, itemId: null, caption, alt });
	const saved = await savePhotos(vehicle, base, content, `Added ${photoCount(photos.length)} to ${SECTION_NAMES[section]}`, author);
	return { revisionId: saved.revisionId, slug: saved.slug, photos };
}

function findEntry(rev: StoredRevision, photoId: string): PhotoEntry {
	const entry = rev.content.photos.find((p) => p.id === photoId);
	if (!entry) throw new ServiceError('That photo is not on this page any more. Reload to see the current photos.', 404);
	return entry;
}

function editSummary(before: PhotoEntry, after: PhotoDetails): string {
	if (before.section !== after.section) return `Moved a photo from ${SECTION_NAMES[before.section]} to ${SECTION_NAMES[after.section]}`;
	const what = [before.caption !== after.caption && 'caption', before.alt !== after.alt && 'description'].filter(Boolean).join(' and ');
	return `Changed a photo's ${what || 'details'} in ${SECTION_NAMES[after.section]}`;
}

/** Changes a photo's caption, description or section as a new revision. */
export async function editPhotoDetails(
	vehicleId: number,
	photoId: string,
	input: { baseRevisionId?: number; details: unknown },
	author: SessionUser
): Promise<{ revisionId: number; slug: string }> {
	const vehicle = await editableVehicle(vehicleId, author, 'Changing a photo');
	const details = parseDetails(input.details);
	const base = await startingRevision(vehicle, input.baseRevisionId);
	const before = findEntry(base, photoId);
	const content = structuredClone(base.content);
	const entry = content.photos.find((p) => p.id === photoId)!;
	Object.assign(entry, details);
	const saved = await savePhotos(vehicle, base, content, editSummary(before, details), author);
	return { revisionId: saved.revisionId, slug: saved.slug };
}

/** Takes a photo off the page as a new revision; the image stays stored for the revisions that show it. */
export async function removePhotoFromVehicle(
	vehicleId: number,
	photoId: string,
	input: { baseRevisionId?: number },
	author: SessionUser
): Promise<{ revisionId: number; slug: string }> {
	const vehicle = await editableVehicle(vehicleId, author, 'Removing a photo');
	const base = await startingRevision(vehicle, input.baseRevisionId);
	const entry = findEntry(base, photoId);
	const content = structuredClone(base.content);
	content.photos = content.photos.filter((p) => p.id !== photoId);
	const saved = await savePhotos(vehicle, base, content, `Removed a photo from ${SECTION_NAMES[entry.section]}`, author);
	return { revisionId: saved.revisionId, slug: saved.slug };
}

export type PagePhoto = PhotoEntry & { width: number | null; height: number | null; bytes: number | null; mime: string | null };
export type SectionPhotos = { section: SectionKey; name: string; photos: PagePhoto[] };

/** A revision's photos, section by section in page order, with what is known of each image. */
export async function photosBySection(content: VehicleContent): Promise<SectionPhotos[]> {
	const ids = content.photos.map((p) => p.id);
	const rows = ids.length ? await Photo.findAll({ where: { id: { [Op.in]: ids } } }) : [];
	const byId = new Map(rows.map((r) => [r.id, r]));
	return SECTION_KEYS.map((section) => ({
		section,
		name: SECTION_NAMES[section],
		photos: content.photos
			.filter((p) => p.section === section)
			.map((p) => {
				const row = byId.get(p.id);
				return { ...p, width: row?.width ?? null, height: row?.height ?? null, bytes: row?.bytes ?? null, mime: row?.mime ?? null };
			})
	}));
}

/**
 * Who may see a photo: whoever may read a revision that shows it (services/visibility.ts), or the person who
 * uploaded it. Anything else is answered as missing, so nobody can tell it exists.
 */
export async function photoVisibleTo(photoId: string, user: Pick<SessionUser, 'id' | 'role'>): Promise<boolean> {
	if (await photoOpenTo(photoId, user)) return true;
	return (await Photo.count({ where: { id: photoId, uploaderId: user.id } })) > 0;
}

/** The stored rendition to stream, or null when there is none under that id. */
export async function openRendition(photoId: string, rendition: Rendition): Promise<StoredObject | null> {
	if (!isPhotoId(photoId)) return null;
	return photoStore().get(renditionKey(photoId, rendition));
}
