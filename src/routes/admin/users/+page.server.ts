import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { changeRole, createUser, listUsers, newUserSchema, setUserStatus, UserError } from '$lib/server/services/users';
import { inviteByEmail, pendingInvites, revokeInvite } from '$lib/server/services/invites';
import { ServiceError } from '$lib/server/errors';
import { MailNotSent } from '$lib/server/mail/transport';
import { config } from '$lib/server/config';
import { ROLES } from '$lib/domain/roles';
import { fieldMessages } from '$lib/server/forms';

export const load: PageServerLoad = async ({ locals }) => {
	requireRole(locals, 'admin');
	const [users, invites] = await Promise.all([listUsers(), pendingInvites()]);
	return {
		users: users.map((u) => ({ id: u.id, email: u.email, name: u.name, role: u.role, status: u.status, createdAt: u.createdAt.toISOString() })),
		invites,
		outbox: !config.production
	};
};

const userRef = z.object({ userId: z.coerce.number().int().positive('Pick a user.') });

export const actions: Actions = {
	invite: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		const form = Object.fromEntries(await request.formData());
		const values = { email: String(form.email ?? ''), role: String(form.role ?? 'viewer') };
		try {
			const sent = await inviteByEmail(form, admin);
			return { invited: sent.email };
		} catch (err) {
			if (err instanceof ServiceError) return fail(err.status, { invite: { values, errors: err.fieldErrors ?? { form: err.message } } });
			if (err instanceof MailNotSent) return fail(503, { invite: { values, errors: { form: `${err.message}. Nothing was sent; try again.` } } });
			throw err;
		}
	},
	revokeInvite: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		const parsed = z.object({ inviteId: z.coerce.number().int().positive('Pick an invitation.') }).safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		try {
			await revokeInvite(parsed.data.inviteId, admin);
		} catch (err) {
			if (err instanceof ServiceError) return fail(err.status, { message: err.message });
			throw err;
		}
		return { message: 'Invitation revoked; its link no longer works.' };
	},
	create: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		const form = Object.fromEntries(await request.formData());
		const parsed = newUserSchema.safeParse(form);
		const values = { email: String(form.email ?? ''), name: String(form.name ?? ''), role: String(form.role ?? 'viewer') };
		if (!parsed.success) return fail(400, { create: { values, errors: fieldMessages(parsed.error) } });
		try {
			await createUser(parsed.data, admin.id);
		} catch (err) {
			if (err instanceof UserError) return fail(400, { create: { values, errors: { [err.field ?? 'form']: err.message } } });
			throw err;
		}
		return { created: parsed.data.email };
	},
	role: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		const parsed = userRef.extend({ role: z.enum(ROLES, { error: 'Choose a valid role.' }) }).safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		try {
			await changeRole(parsed.data.userId, parsed.data.role, admin.id);
		} catch (err) {
			if (err instanceof UserError) return fail(400, { message: err.message });
			throw err;
		}
		return { message: 'Role changed.' };
	},
	status: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		const parsed = userRef.extend({ status: z.enum(['active', 'disabled'], { error: 'Choose active or disabled.' }) }).safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { message: parsed.error.issues[0].message });
		try {
			await setUserStatus(parsed.data.userId, parsed.data.status, admin.id);
		} catch (err) {
			if (err instanceof UserError) return fail(400, { message: err.message });
			throw err;
		}
		return { message: parsed.data.status === 'disabled' ? 'Account disabled; the person is signed out at once.' : 'Account enabled again.' };
	}
};
