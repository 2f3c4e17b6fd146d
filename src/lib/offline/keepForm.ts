import type { SubmitFunction } from '@sveltejs/kit';
import { page } from '$app/state';
import { keepPost } from './outbox';

// For a form whose post may wait on the phone (a trust mark): with no network, or when the
// network drops mid-send, the post is kept and `onkept` tells the person so; nothing pretends it
// reached the server. Such a form carries `data-keeps-offline` so the offline guard lets it through.

export function keepingOffline(slug: string, label: (form: FormData) => string, onkept: () => void): SubmitFunction {
	const keep = async (action: URL, formData: FormData) => {
		const fields = [...formData].filter((entry): entry is [string, string] => typeof entry[1] === 'string');
		const by = (page.data.user as { id?: number } | null | undefined)?.id;
		if (by === undefined) return;
		await keepPost({ action: `${action.pathname}${action.search}`, fields, label: label(formData), slug, by });
		onkept();
	};
	return ({ action, formData, cancel }) => {
		if (!navigator.onLine) {
			cancel();
			void keep(action, formData);
			return;
		}
		return async ({ result, update }) => {
			if (result.type === 'error' && result.error instanceof TypeError) await keep(action, formData);
			else await update();
		};
	};
}
