import { jpegName, percentSent, RETRY_WAITS_MS, scaledSize, UPLOAD_QUALITY } from '../../domain/photoUpload';

// Camera photos leave the phone small and clean: drawn upright at upload size and written again
// as JPEG, which carries none of the camera's metadata (location included). They go up with
// progress reported and are sent again when the connection drops.

/** The copy of a photo the phone sends; a file the browser cannot read goes as it is, for the server to judge. */
export async function preparePhoto(file: File): Promise<File> {
	if (!file.type.startsWith('image/') || typeof createImageBitmap !== 'function') return file;
	let bitmap: ImageBitmap;
	try {
		bitmap = await createImageBitmap(file, { imageOrientation: 'from-image' });
	} catch {
		return file;
	}
	try {
		const size = scaledSize(bitmap.width, bitmap.height);
		const canvas = document.createElement('canvas');
		canvas.width = size.width;
		canvas.height = size.height;
		const context = canvas.getContext('2d');
		if (!context) return file;
		context.drawImage(bitmap, 0, 0, size.width, size.height);
		const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/jpeg', UPLOAD_QUALITY));
		return blob ? new File([blob], jpegName(file.name), { type: 'image/jpeg', lastModified: file.lastModified }) : file;
	} finally {
		bitmap.close();
	}
}

export type Answer = { status: number; body: string };
type Progress = { onprogress: (percent: number) => void; onretry: (attempt: number, of: number) => void };

/** Statuses from a proxy or a restarting server that a second try may get past. */
const PASSING_TROUBLE = new Set([502, 503, 504]);

function sendOnce(address: string, body: FormData, onprogress: Progress['onprogress']): Promise<Answer> {
	return new Promise((resolve, reject) => {
		const request = new XMLHttpRequest();
		request.open('POST', address);
		request.setRequestHeader('accept', 'application/json');
		request.setRequestHeader('x-sveltekit-action', 'true');
		request.timeout = 120_000;
		request.upload.onprogress = (e) => onprogress(percentSent(e.loaded, e.lengthComputable ? e.total : 0));
		request.onload = () => (PASSING_TROUBLE.has(request.status) ? reject(new TypeError(`status ${request.status}`)) : resolve({ status: request.status, body: request.responseText }));
		request.onerror = () => reject(new TypeError('connection dropped'));
		request.ontimeout = () => reject(new TypeError('no answer'));
		request.send(body);
	});
}

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** Posts a form with upload progress, trying again after each wait in RETRY_WAITS_MS; throws when every try failed. */
export async function postWithRetries(address: string, body: FormData, progress: Progress): Promise<Answer> {
	for (let attempt = 0; ; attempt++) {
		try {
			return await sendOnce(address, body, progress.onprogress);
		} catch (problem) {
			if (attempt >= RETRY_WAITS_MS.length) throw problem;
			progress.onretry(attempt + 1, RETRY_WAITS_MS.length);
			await pause(RETRY_WAITS_MS[attempt]);
		}
	}
}
