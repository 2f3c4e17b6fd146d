import { error, fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { currentRevision, requireVehicle, vehicleBySlug } from '$lib/server/services/vehicles';
import { canEditVehicle } from '$lib/server/services/revisions';
import {
	addPhotosToVehicle,
	editPhotoDetails,
	isPhotoId,
	MAX_FILES_PER_UPLOAD,
	photosBySection,
	removePhotoFromVehicle
} from '$lib/server/services/photos';
import { ACCEPTED_NAMES, formatBytes, photoLimits } from '$lib/server/storage/renditions';
import { ServiceError } from '$lib/server/errors';

export const load: PageServerLoad = async ({ locals, params }) => {
	const user = requireRole(locals, 'editor');
	const found = await vehicleBySlug(params.slug);
	if (!found) error(404, 'No vehicle page at this address.');
	if ('redirectTo' in found) redirect(301, `/vehicles/${found.redirectTo}/photos`);
	const { vehicle } = found;
	const revision = await currentRevision(vehicle);
	if (!revision) error(404, 'This vehicle page has no saved revision yet.');
	const limits = photoLimits();
	return {
		vehicle: { slug: vehicle.slug, title: vehicle.title, protection: vehicle.protection },
		revisionId: revision.id,
		sections: await photosBySection(revision.content),
		canEdit: canEditVehicle(user, vehicle),
		limits: { maxBytes: limits.maxBytes, maxBytesText: formatBytes(limits.maxBytes), maxFiles: MAX_FILES_PER_UPLOAD, accepted: ACCEPTED_NAMES }
	};
};

const text = (v: FormDataEntryValue | null) => (typeof v === 'string' ? v : '');

const photoRef = z.object({
	photoId: z.string().refine(isPhotoId, { error: 'Pick a photo on this page.' }),
	baseRevisionId: z.coerce.number().int().positive({ error: 'Reload the page and try again.' })
});

type Outcome = { form: 'upload' | 'caption' | 'remove'; message: string; revisionId: number; photoId?: string };

/** Service refusals come back to the form that caused them, with what was typed kept. */
async function attempt(run: () => Promise<Outcome>, keep: Record<string, unknown>) {
	try {
		return await run();
	} catch (err) {
		if (err instanceof ServiceError) return fail(err.status, { ...keep, message: err.message, errors: err.fieldErrors ?? {} });
		throw err;
	}
}

export const actions: Actions = {
	upload: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'editor');
		const form = await request.formData();
		const values = { section: text(form.get('section')), caption: text(form.get('caption')), alt: text(form.get('alt')) };
		// A file input left empty still posts one nameless, zero-byte part.
		const files = form.getAll('files').filter((f): f is File => typeof f !== 'string' && (f.name !== '' || f.size > 0));
		return attempt(
			async () => {
				const vehicle = await requireVehicle(params.slug);
				const uploads = await Promise.all(files.map(async (f) => ({ name: f.name, bytes: new Uint8Array(await f.arrayBuffer()) })));
				const added = await addPhotosToVehicle(vehicle.id, uploads, values, user);
				const n = added.photos.length;
				return { form: 'upload' as const, message: `${n === 1 ? 'Photo' : `${n} photos`} added as revision ${added.revisionId}.`, revisionId: added.revisionId };
			},
			{ form: 'upload', values }
		);
	},
	caption: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'editor');
		const form = await request.formData();
		const values = { section: text(form.get('section')), caption: text(form.get('caption')), alt: text(form.get('alt')) };
		const ref = photoRef.safeParse({ photoId: text(form.get('photoId')), baseRevisionId: text(form.get('baseRevisionId')) });
		if (!ref.success) return fail(400, { form: 'caption', message: ref.error.issues[0].message, errors: {} });
		const { photoId, baseRevisionId } = ref.data;
		return attempt(
			async () => {
				const vehicle = await requireVehicle(params.slug);
				const saved = await editPhotoDetails(vehicle.id, photoId, { baseRevisionId, details: values }, user);
				return { form: 'caption' as const, photoId, message: `Photo details saved as revision ${saved.revisionId}.`, revisionId: saved.revisionId };
			},
			{ form: 'caption', photoId, values }
		);
	},
	remove: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'editor');
		const form = await request.formData();
		const ref = photoRef.safeParse({ photoId: text(form.get('photoId')), baseRevisionId: text(form.get('baseRevisionId')) });
		if (!ref.success) return fail(400, { form: 'remove', message: ref.error.issues[0].message, errors: {} });
		const { photoId, baseRevisionId } = ref.data;
		return attempt(
			async () => {
				const vehicle = await requireVehicle(params.slug);
				const saved = await removePhotoFromVehicle(vehicle.id, photoId, { baseRevisionId }, user);
				return {
					form: 'remove' as const,
					photoId,
					message: `Photo removed from the page as revision ${saved.revisionId}. Earlier revisions still show it, and restoring one brings it back.`,
					revisionId: saved.revisionId
				};
			},
			{ form: 'remove', photoId }
		);
	}
};
