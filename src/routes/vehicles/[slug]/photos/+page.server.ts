import { error, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { requireVehicle, vehicleBySlug } from '$lib/server/services/vehicles';
import { pageRevision } from '$lib/server/services/visibility';
import { canEditVehicle } from '$lib/server/services/revisions';
import {
	addPhotosToVehicle,
	editPhotoDetails,
	isPhotoId,
	MAX_FILES_PER_UPLOAD,
	photosBySection,
	removePhotoFromVehicle
} from '$lib/server/services/photos';
import { ACCEPTED_NAMES, formatBytes } from '$lib/server/storage/renditions';
import { config } from '$lib/server/config';
import { formAction, textFields } from '$lib/server/forms';

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireRole(locals, 'editor');
	const found = await vehicleBySlug(params.slug);
	if (!found) error(404, 'No vehicle page at this address.');
	if ('redirectTo' in found) redirect(301, `/vehicles/${found.redirectTo}/photos`);
	const { vehicle } = found;
	const { revision } = await pageRevision(vehicle, user);
	if (!revision) error(404, 'This vehicle page has no saved revision yet.');
	const limits = config.photos;
	return {
		vehicle: { slug: vehicle.slug, title: vehicle.title, protection: vehicle.protection },
		revisionId: revision.id,
		sections: await photosBySection(revision.content),
		canEdit: canEditVehicle(user, vehicle),
		limits: { maxBytes: limits.maxBytes, maxBytesText: formatBytes(limits.maxBytes), maxFiles: MAX_FILES_PER_UPLOAD, accepted: ACCEPTED_NAMES }
	};
};

const photoRef = z.object({
	photoId: z.string().refine(isPhotoId, { error: 'Pick a photo on this page.' }),
	baseRevisionId: z.coerce.number().int().positive({ error: 'Reload the page and try again.' })
});

const DETAILS = ['section', 'caption', 'alt'] as const;

export const actions: Actions = {
	upload: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'editor');
		return formAction(
			request,
			async (posted) => {
				// A file input left empty still posts one nameless, zero-byte part.
				const files = posted.getAll('files').filter((f): f is File => typeof f !== 'string' && (f.name !== '' || f.size > 0));
				const vehicle = await requireVehicle(params.slug);
				const uploads = await Promise.all(files.map(async (f) => ({ name: f.name, bytes: new Uint8Array(await f.arrayBuffer()) })));
				const added = await addPhotosToVehicle(vehicle.id, uploads, textFields(posted, DETAILS), user);
				const n = added.photos.length;
				return { action: 'upload', message: `${n === 1 ? 'Photo' : `${n} photos`} added as revision ${added.revisionId}.`, revisionId: added.revisionId };
			},
			{ action: 'upload', values: DETAILS }
		);
	},
	caption: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'editor');
		return formAction(
			request,
			async (posted) => {
				const { photoId, baseRevisionId } = photoRef.parse(textFields(posted, ['photoId', 'baseRevisionId']));
				const vehicle = await requireVehicle(params.slug);
				const saved = await editPhotoDetails(vehicle.id, photoId, { baseRevisionId, details: textFields(posted, DETAILS) }, user);
				return { action: 'caption', photoId, message: `Photo details saved as revision ${saved.revisionId}.`, revisionId: saved.revisionId };
			},
			{ action: 'caption', values: [...DETAILS, 'photoId'] }
		);
	},
	remove: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'editor');
		return formAction(
			request,
			async (posted) => {
				const { photoId, baseRevisionId } = photoRef.parse(textFields(posted, ['photoId', 'baseRevisionId']));
				const vehicle = await requireVehicle(params.slug);
				const saved = await removePhotoFromVehicle(vehicle.id, photoId, { baseRevisionId }, user);
				return {
					action: 'remove',
					photoId,
					message: `Photo removed from the page as revision ${saved.revisionId}. Earlier revisions still show it, and restoring one brings it back.`,
					revisionId: saved.revisionId
				};
			},
			{ action: 'remove', values: ['photoId'] }
		);
	}
};
