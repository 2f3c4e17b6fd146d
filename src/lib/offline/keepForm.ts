import type { ActionResult, SubmitFunction } from '@sveltejs/kit';
import { page } from '$app/state';
import { textFields, type WaitingKind } from '../domain/offlineOutbox';
import { keepPost } from './outbox';

// For a form whose post may wait on the phone (a trust mark, a change in the editor): with no
// network, or when the network drops mid-send, the post is kept and the person is told so; nothing
// pretends it reached the server. Such a form carries `data-keeps-offline` so the offline guard lets it through.

export type KeptAs = { label: string; slug: string; kind?: WaitingKind; vehicleId?: number };

/** The signed-in person on this screen, whose posts these are. */
export const signedInId = (): number | undefined => (page.data.user as { id?: number } | null | undefined)?.id;

/** Puts a form's post in the outbox as the form would have sent it; false when nobody is signed in. */
export async function keepSubmission(action: URL, formData: FormData, as: KeptAs): Promise<boolean> {
	const by = signedInId();
	if (by === undefined) return false;
	await keepPost({ ...as, action: `${action.pathname}${action.search}`, fields: textFields(formData), by });
	return true;
}

/** An enhanced form's result when the network dropped before the server answered. */
export const networkDropped = (result: ActionResult) => result.type === 'error' && result.error instanceof TypeError;

export function keepingOffline(slug: string, label: (form: FormData) => string, onkept: () => void): SubmitFunction {
	const keep = async (action: URL, formData: FormData) => {
		if (await keepSubmission(action, formData, { label: label(formData), slug, kind: 'mark' })) onkept();
	};
	return ({ action, formData, cancel }) => {
		if (!navigator.onLine) {
			cancel();
			void keep(action, formData);
			return;
		}
		return async ({ result, update }) => {
			if (networkDropped(result)) await keep(action, formData);
			else await update();
		};
	};
}
