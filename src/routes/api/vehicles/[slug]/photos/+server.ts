import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall } from '$lib/server/http';
import { requireVehicle } from '$lib/server/services/vehicles';
import { addPhotosToVehicle, photoUrl } from '$lib/server/services/photos';
import { ServiceError } from '$lib/server/errors';

const text = (v: FormDataEntryValue | null) => (typeof v === 'string' ? v : undefined);

/** One image in the multipart field `file`, with `section`, `alt` and an optional `caption`; added to the page as a new revision. */
export const POST: RequestHandler = ({ locals, params, request }) =>
	apiCall(async () => {
		const user = requireRole(locals, 'editor');
		const vehicle = await requireVehicle(params.slug);
		let form: FormData;
		try {
			form = await request.formData();
		} catch {
			throw new ServiceError('Send the photo as multipart/form-data, with the image in the field "file".', 400);
		}
		const details = { section: text(form.get('section')), caption: text(form.get('caption')), alt: text(form.get('alt')) };
		const files = form.getAll('file').filter((f): f is File => typeof f !== 'string');
		if (files.length > 1) throw new ServiceError('Send one image per request in the field "file".', 400, { file: 'One image per request.' });
		const uploads = await Promise.all(files.map(async (f) => ({ name: f.name, bytes: new Uint8Array(await f.arrayBuffer()) })));
		const added = await addPhotosToVehicle(vehicle.id, uploads, details, user);
		const [photo] = added.photos;
		return json(
			{
				id: photo.id,
				sha256: photo.sha256,
				width: photo.width,
				height: photo.height,
				url: photoUrl(photo.id, 'display'),
				thumbUrl: photoUrl(photo.id, 'thumb'),
				revisionId: added.revisionId
			},
			{ status: 201, headers: { Location: photoUrl(photo.id, 'display') } }
		);
	});
