import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { requireVehicle } from '$lib/server/services/vehicles';
import { restoreRevision, setProtection, setRevisionHidden } from '$lib/server/services/revisions';
import { ServiceError } from '$lib/server/errors';

const revisionRef = z.object({ revisionId: z.coerce.number().int().positive('Pick a revision.') });

async function moderate<T>(run: () => Promise<T>) {
	try {
		return await run();
	} catch (err) {
		if (err instanceof ServiceError) return fail(err.status, { message: err.message });
		throw err;
	}
}

export const actions: Actions = {
	restore: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'moderator');
		const parsed = revisionRef.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		return moderate(async () => {
			const vehicle = await requireVehicle(params.slug);
			const saved = await restoreRevision(vehicle.id, parsed.data.revisionId, user);
			return { message: `Restored revision ${parsed.data.revisionId} as new revision ${saved.revisionId}.` };
		});
	},
	hide: async ({ locals, request }) => {
		const user = requireRole(locals, 'moderator');
		const parsed = revisionRef
			.extend({ hidden: z.enum(['true', 'false']), reason: z.string().trim().max(300, 'Keep the reason under 300 characters.').default('') })
			.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		return moderate(async () => {
			const hidden = parsed.data.hidden === 'true';
			await setRevisionHidden(parsed.data.revisionId, hidden, parsed.data.reason, user);
			return { message: hidden ? `Revision ${parsed.data.revisionId} hidden.` : `Revision ${parsed.data.revisionId} shown again.` };
		});
	},
	protect: async ({ locals, params, request }) => {
		const user = requireRole(locals, 'moderator');
		const parsed = z.object({ protection: z.enum(['none', 'moderators'], { error: 'Choose who may edit.' }) }).safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		return moderate(async () => {
			const vehicle = await requireVehicle(params.slug);
			await setProtection(vehicle.id, parsed.data.protection, user);
			return { message: parsed.data.protection === 'moderators' ? 'Page protected: only moderators can edit it now.' : 'Protection removed: editors can edit again.' };
		});
	}
};
