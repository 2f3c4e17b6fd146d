import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { renewSession } from '$lib/server/auth/session';
import { changeName, changePassword } from '$lib/server/services/account';
import { setUnits } from '$lib/server/services/preferences';
import { noticePreferences, setNoticePreferences } from '$lib/server/services/watch';
import { ServiceError } from '$lib/server/errors';
import { fieldMessages } from '$lib/server/forms';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireRole(locals, 'viewer');
	return { account: { name: user.name, email: user.email, role: user.role, units: user.units, block: user.block ?? null }, notices: await noticePreferences(user.id) };
};

function refused(section: string, err: unknown) {
	if (err instanceof ServiceError) return fail(err.status, { section, errors: err.fieldErrors ?? { form: err.message } });
	throw err;
}

const unitsForm = z.object({ units: z.enum(['metric', 'imperial'], { error: 'Choose metric or imperial.' }) });
const noticesForm = z.object({
	watchOwnEdits: z.enum(['yes', 'no'], { error: 'Choose yes or no.' }),
	noticeMode: z.enum(['immediate', 'digest'], { error: 'Choose at once or a daily digest.' })
});

export const actions: Actions = {
	name: async ({ locals, request }) => {
		const user = requireRole(locals, 'viewer');
		try {
			await changeName(user.id, Object.fromEntries(await request.formData()));
		} catch (err) {
			return refused('name', err);
		}
		return { section: 'name', saved: 'Name saved.' };
	},
	password: async ({ locals, request, getClientAddress, cookies }) => {
		const user = requireRole(locals, 'viewer');
		let sessionVersion: number;
		try {
			sessionVersion = await changePassword(user, Object.fromEntries(await request.formData()), getClientAddress());
		} catch (err) {
			return refused('password', err);
		}
		const stillSignedIn = await renewSession(cookies, sessionVersion);
		return {
			section: 'password',
			saved: stillSignedIn
				? 'Password changed. Every other device was signed out; this one stays signed in.'
				: 'Password changed. Every device was signed out; sign in with the new password.'
		};
	},
	units: async ({ locals, request }) => {
		const user = requireRole(locals, 'viewer');
		const parsed = unitsForm.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { section: 'units', errors: fieldMessages(parsed.error) });
		await setUnits(user.id, parsed.data.units);
		return { section: 'units', saved: parsed.data.units === 'metric' ? 'Measurements show in millimetres.' : 'Measurements show in inches.' };
	},
	notifications: async ({ locals, request }) => {
		const user = requireRole(locals, 'viewer');
		const parsed = noticesForm.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { section: 'notifications', errors: fieldMessages(parsed.error) });
		await setNoticePreferences(user.id, { watchOwnEdits: parsed.data.watchOwnEdits === 'yes', noticeMode: parsed.data.noticeMode });
		return { section: 'notifications', saved: 'Notification settings saved.' };
	}
};
