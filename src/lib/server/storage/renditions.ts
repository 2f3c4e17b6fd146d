import { createHash } from 'node:crypto';
import { fileTypeFromBuffer } from 'file-type';
import sharp, { type Metadata } from 'sharp';
import { ServiceError } from '../errors';
import { config } from '../config';

export const RENDITIONS = ['display', 'thumb'] as const;
export type Rendition = (typeof RENDITIONS)[number];
export const RENDITION_TYPE = 'image/webp';

// Long side in pixels: display fills a laptop screen, thumb a strip tile on a high-density phone.
const RENDITION_SIZE: Readonly<Record<Rendition, { longSide: number; quality: number }>> = {
	display: { longSide: 1600, quality: 80 },
	thumb: { longSide: 400, quality: 72 }
};

export function renditionKey(photoId: string, rendition: Rendition): string {
	return `photos/${photoId}/${rendition}.webp`;
}

export type PhotoLimits = { maxBytes: number; maxPixels: number };

const MB = 1024 * 1024;


// Decided from the bytes, never the name or declared type. The prebuilt image library reads AVIF
// but has no HEVC decoder, so HEIC is tried and, when it fails, refused with advice.
const ACCEPTED_TYPES: Readonly<Record<string, string>> = {
	'image/jpeg': 'JPEG',
	'image/png': 'PNG',
	'image/webp': 'WebP',
	'image/avif': 'AVIF'
};
const HEIF_TYPES = new Set(['image/heic', 'image/heif', 'image/heic-sequence', 'image/heif-sequence']);
export const ACCEPTED_NAMES = 'JPEG, PNG, WebP or AVIF';

export function formatBytes(bytes: number, decimals = 1): string {
	if (bytes >= MB) return `${(bytes / MB).toFixed(decimals).replace(/\.0+$/, '')} MB`;
	if (bytes >= 1024) return `${Math.round(bytes / 1024)} KB`;
	return `${bytes} bytes`;
}

/** A size just over a limit is shown with enough digits to differ from it ("15.01 MB", not "15 MB"). */
function formatAbove(bytes: number, limit: number): string {
	let decimals = 1;
	while (decimals < 4 && formatBytes(bytes, decimals) === formatBytes(limit, decimals)) decimals++;
	return formatBytes(bytes, decimals);
}

/** A file name fit to quote back in a message: no control characters, not too long. */
export function fileLabel(name: string | undefined): string {
	const clean = (name ?? '').replace(/[\u0000-\u001f\u007f]/g, '').trim();
	if (!clean) return 'The photo';
	return `“${clean.length > 60 ? `${clean.slice(0, 57)}…` : clean}”`;
}

export type CheckedPhoto = {
	sha256: string;
	mime: string;
	/** As shown, after the camera's orientation flag is applied. */
	width: number;
	height: number;
	bytes: number;
	renditions: Record<Rendition, Buffer>;
};

export function sha256Hex(bytes: Uint8Array): string {
	return createHash('sha256').update(bytes).digest('hex');
}

/** Empty and oversized files are refused before anything else reads them. */
export function checkSize(bytes: Uint8Array, name: string, limits: PhotoLimits = config.photos): void {
	const label = fileLabel(name);
	if (bytes.byteLength === 0) {
		throw new ServiceError(`${label} is empty (0 bytes). Choose the photo again; if it lives in a cloud folder, download it to the device first.`, 400);
	}
	if (bytes.byteLength > limits.maxBytes) {
		throw new ServiceError(
			`${label} is ${formatAbove(bytes.byteLength, limits.maxBytes)}, over the ${formatBytes(limits.maxBytes)} limit for one photo. Share or export a smaller copy and try again.`,
			413
		);
	}
}

function looksLikeText(bytes: Uint8Array): boolean {
	const head = Buffer.from(bytes.subarray(0, 512)).toString('utf8').replace(/^\uFEFF/, '').trimStart();
	return head.startsWith('<');
}

function undecodable(label: string): ServiceError {
	return new ServiceError(`${label} could not be read as an image: it looks damaged or cut short. Take or export the photo again.`, 415);
}

/**
 * Everything Kickpanel checks before it keeps a photo: size, real type, pixel count and a full decode;
 * then the display and thumbnail renditions, turned upright and with every bit of metadata (GPS,
 * camera, time) left behind. Throws a ServiceError a person can act on; writes nothing.
 */
export async function inspectUpload(bytes: Uint8Array, name: string, limits: PhotoLimits = config.photos): Promise<CheckedPhoto> {
	checkSize(bytes, name, limits);
	const label = fileLabel(name);
	const type = await fileTypeFromBuffer(bytes);
	if (!type) {
		const what = looksLikeText(bytes) ? 'it holds text (a web page or a drawing such as SVG), not a photo' : 'its contents are not an image format Kickpanel reads';
		throw new ServiceError(`${label} was refused: ${what}, whatever its name says. Upload a ${ACCEPTED_NAMES} photo.`, 415);
	}
	const heif = HEIF_TYPES.has(type.mime);
	if (!heif && !ACCEPTED_TYPES[type.mime]) {
		throw new ServiceError(`${label} is a ${type.ext.toUpperCase()} file, not a photo Kickpanel accepts. Upload a ${ACCEPTED_NAMES} photo.`, 415);
	}

	let meta: Metadata;
	try {
		// Header only, with no pixel limit, so an oversized image can be refused by name and size.
		meta = await sharp(bytes, { limitInputPixels: false }).metadata();
	} catch {
		throw heif ? heicRefusal(label) : undecodable(label);
	}
	const pixels = meta.width * meta.height;
	if (!(pixels > 0)) throw undecodable(label);
	if (pixels > limits.maxPixels) {
		const mp = (n: number) => Math.round(n / 1e6);
		throw new ServiceError(
			`${label} is ${meta.width} × ${meta.height} pixels (${mp(pixels)} megapixels); Kickpanel reads photos up to ${mp(limits.maxPixels)} megapixels. Export a smaller copy.`,
			413
		);
	}

	let display: Buffer;
	try {
		display = await sharp(bytes, { limitInputPixels: limits.maxPixels, failOn: 'error' })
			.rotate()
			.resize({ width: RENDITION_SIZE.display.longSide, height: RENDITION_SIZE.display.longSide, fit: 'inside', withoutEnlargement: true })
			.webp({ quality: RENDITION_SIZE.display.quality })
			.toBuffer();
	} catch {
		throw heif ? heicRefusal(label) : undecodable(label);
	}
	const thumb = await sharp(display)
		.resize({ width: RENDITION_SIZE.thumb.longSide, height: RENDITION_SIZE.thumb.longSide, fit: 'inside', withoutEnlargement: true })
		.webp({ quality: RENDITION_SIZE.thumb.quality })
		.toBuffer();

	return {
		sha256: sha256Hex(bytes),
		mime: type.mime,
		width: meta.autoOrient?.width ?? meta.width,
		height: meta.autoOrient?.height ?? meta.height,
		bytes: bytes.byteLength,
		renditions: { display, thumb }
	};
}

function heicRefusal(label: string): ServiceError {
	return new ServiceError(
		`${label} is a HEIC photo, which this server cannot read. On the phone, share it as JPEG (or set the camera to “Most Compatible”), then upload it again.`,
		415
	);
}
