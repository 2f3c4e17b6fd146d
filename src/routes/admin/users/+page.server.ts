import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { changeRole, createUser, listUsers, newUserSchema, setUserStatus } from '$lib/server/services/users';
import { inviteByEmail, pendingInvites, revokeInvite } from '$lib/server/services/invites';
import { config } from '$lib/server/config';
import { formAction } from '$lib/server/forms';
import { ROLES } from '$lib/domain/roles';

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
const inviteRef = z.object({ inviteId: z.coerce.number().int().positive('Pick an invitation.') });
const roleForm = userRef.extend({ role: z.enum(ROLES, { error: 'Choose a valid role.' }) });
const statusForm = userRef.extend({ status: z.enum(['active', 'disabled'], { error: 'Choose active or disabled.' }) });

export const actions: Actions = {
	invite: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		return formAction(
			request,
			async (posted) => {
				const sent = await inviteByEmail(Object.fromEntries(posted), admin);
				return sent.sent ? { invited: sent.email } : { invited: sent.email, queued: true };
			},
			{ action: 'invite', values: ['email', 'role'] }
		);
	},
	revokeInvite: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		return formAction(request, async (posted) => {
			await revokeInvite(inviteRef.parse(Object.fromEntries(posted)).inviteId, admin);
			return { message: 'Invitation revoked; its link no longer works.' };
		});
	},
	create: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		return formAction(
			request,
			async (posted) => {
				const user = newUserSchema.parse(Object.fromEntries(posted));
				await createUser(user, admin.id);
				return { created: user.email };
			},
			{ action: 'create', values: ['email', 'name', 'role'] }
		);
	},
	role: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		return formAction(request, async (posted) => {
			const { userId, role } = roleForm.parse(Object.fromEntries(posted));
			await changeRole(userId, role, admin.id);
			return { message: 'Role changed.' };
		});
	},
	status: async ({ locals, request }) => {
		const admin = requireRole(locals, 'admin');
		return formAction(request, async (posted) => {
			const { userId, status } = statusForm.parse(Object.fromEntries(posted));
			await setUserStatus(userId, status, admin.id);
			return { message: status === 'disabled' ? 'Account disabled; the person is signed out at once.' : 'Account enabled again.' };
		});
	}
};
