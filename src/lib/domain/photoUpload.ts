// How a phone prepares and sends a camera photo: scaled down on the phone before it leaves
// (the server's display copy is 1600 px on the long side, so 2048 px loses nothing it shows),
// and sent again after a dropped connection, waiting a little longer each time.

/** Long side, in pixels, of the copy a phone uploads. */
export const UPLOAD_LONG_SIDE = 2048;
/** JPEG quality of that copy (0–1). */
export const UPLOAD_QUALITY = 0.88;
/** Waits before each new try after a dropped connection, in milliseconds. */
export const RETRY_WAITS_MS = [1_000, 3_000, 8_000] as const;

/** The size a photo is drawn at: within `longSide` on its long side, proportions kept, never enlarged. */
export function scaledSize(width: number, height: number, longSide = UPLOAD_LONG_SIDE): { width: number; height: number } {
	if (!(width > 0 && height > 0)) throw new RangeError('A photo has a positive width and height.');
	const scale = Math.min(1, longSide / Math.max(width, height));
	return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) };
}

/** "IMG_0042.HEIC" → "IMG_0042.jpg": the uploaded copy is a JPEG whatever the camera wrote. */
export function jpegName(name: string): string {
	const stem = name.replace(/\.[^./\\]*$/, '') || 'photo';
	return `${stem}.jpg`;
}

/** Share of an upload sent, as a whole percentage (0 when the size is not known yet). */
export function percentSent(loaded: number, total: number): number {
	if (!(total > 0)) return 0;
	return Math.min(100, Math.max(0, Math.floor((loaded / total) * 100)));
}
