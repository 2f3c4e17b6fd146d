import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { renewSession } from '$lib/server/auth/session';
import { formAction } from '$lib/server/forms';
import { changeName, changePassword } from '$lib/server/services/account';
import { setUnits } from '$lib/server/services/preferences';
import { noticePreferences, setNoticePreferences } from '$lib/server/services/watch';

export const load: PageServerLoad = async ({ locals }) => {
	const user = requireRole(locals, 'viewer');
	return { account: { name: user.name, email: user.email, role: user.role, units: user.units, block: user.block ?? null }, notices: await noticePreferences(user.id) };
};

const unitsForm = z.object({ units: z.enum(['metric', 'imperial'], { error: 'Choose metric or imperial.' }) });
const noticesForm = z.object({
	watchOwnEdits: z.enum(['yes', 'no'], { error: 'Choose yes or no.' }),
	noticeMode: z.enum(['immediate', 'digest'], { error: 'Choose at once or one round-up a day.' })
});

export const actions: Actions = {
	name: async ({ locals, request }) => {
		const user = requireRole(locals, 'viewer');
		return formAction(
			request,
			async (posted) => {
				await changeName(user.id, Object.fromEntries(posted));
				return { action: 'name', saved: 'Name saved.' };
			},
			{ action: 'name' }
		);
	},
	password: async ({ locals, request, getClientAddress, cookies }) => {
		const user = requireRole(locals, 'viewer');
		return formAction(
			request,
			async (posted) => {
				const sessionVersion = await changePassword(user, Object.fromEntries(posted), getClientAddress());
				const stillSignedIn = await renewSession(cookies, sessionVersion);
				return {
					action: 'password',
					saved: stillSignedIn
						? 'Password changed. Every other device was signed out; this one stays signed in.'
						: 'Password changed. Every device was signed out; sign in with the new password.'
				};
			},
			{ action: 'password' }
		);
	},
	units: async ({ locals, request }) => {
		const user = requireRole(locals, 'viewer');
		return formAction(
			request,
			async (posted) => {
				const { units } = unitsForm.parse(Object.fromEntries(posted));
				await setUnits(user.id, units);
				return { action: 'units', saved: units === 'metric' ? 'Measurements show in millimetres.' : 'Measurements show in inches.' };
			},
			{ action: 'units' }
		);
	},
	notifications: async ({ locals, request }) => {
		const user = requireRole(locals, 'viewer');
		return formAction(
			request,
			async (posted) => {
				const { watchOwnEdits, noticeMode } = noticesForm.parse(Object.fromEntries(posted));
				await setNoticePreferences(user.id, { watchOwnEdits: watchOwnEdits === 'yes', noticeMode });
				return { action: 'notifications', saved: 'Notification settings saved.' };
			},
			{ action: 'notifications' }
		);
	}
};
