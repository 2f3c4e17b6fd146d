import { deserialize } from '$app/forms';
import { replacedBy } from '../domain/offlineOutbox';
import { phoneStore, type WaitingPost } from './phoneStore';

// Form posts made with no signal (a trust mark, a flag, a change in the editor) wait here and go out
// when the network returns, to the same form action with the same fields, so the server checks them
// as it would have then: a mark on a revision that changed meanwhile is refused, a change is merged
// from the revision it started from (or refused when it clashes), and the person sees why.

export const OUTBOX_CHANGED = 'kp-outbox-changed';
const announce = () => window.dispatchEvent(new Event(OUTBOX_CHANGED));

/** Keeps a post; a newer change to a page replaces the same person's older one still waiting. */
export async function keepPost(post: Omit<WaitingPost, 'id' | 'madeAt' | 'refusal'>): Promise<void> {
	const tx = (await phoneStore()).transaction('outbox', 'readwrite');
	for (const old of replacedBy(await tx.store.getAll(), post)) if (old.id !== undefined) await tx.store.delete(old.id);
	await tx.store.add({ ...post, madeAt: new Date().toISOString() });
	await tx.done;
	announce();
}

/** Drops a person's changes to a page still waiting: they saved the page themselves since. */
export async function dropWaitingChanges(vehicleId: number, by: number): Promise<void> {
	const db = await phoneStore();
	const gone = replacedBy(await db.getAll('outbox'), { kind: 'edit', vehicleId, by, slug: '' });
	for (const post of gone) if (post.id !== undefined) await db.delete('outbox', post.id);
	if (gone.length) announce();
}

/** The signed-in person's posts still on the phone. */
export async function waitingPosts(signedIn: number): Promise<WaitingPost[]> {
	return (await (await phoneStore()).getAll('outbox')).filter((p) => p.by === signedIn);
}

export async function dismissPost(id: number): Promise<void> {
	await (await phoneStore()).delete('outbox', id);
	announce();
}

type Outcome = 'sent' | 'refused' | 'unreachable';

async function send(post: WaitingPost): Promise<{ outcome: Outcome; message?: string }> {
	const body = new FormData();
	for (const [name, value] of post.fields) body.append(name, value);
	let response: Response;
	try {
		response = await fetch(post.action, { method: 'POST', body, headers: { accept: 'application/json', 'x-sveltekit-action': 'true' } });
	} catch {
		return { outcome: 'unreachable' };
	}
	const result = deserialize(await response.text());
	if (result.type === 'success' || result.type === 'redirect') return { outcome: 'sent' };
	if (result.type === 'failure') {
		const data = (result.data ?? {}) as { message?: unknown };
		return { outcome: 'refused', message: typeof data.message === 'string' ? data.message : 'The server refused it.' };
	}
	if (response.status >= 500) return { outcome: 'unreachable' };
	return { outcome: 'refused', message: response.status === 401 || response.status === 403 ? 'Sign in again, then send it.' : 'The server refused it.' };
}

let sending: Promise<WaitingPost[]> | null = null;

/** Sends every waiting post of the signed-in person once, oldest first; returns those that went through. */
export function sendWaiting(signedIn: number): Promise<WaitingPost[]> {
	sending ??= (async () => {
		const db = await phoneStore();
		const sent: WaitingPost[] = [];
		for (const post of await db.getAll('outbox')) {
			if (post.refusal || post.id === undefined || post.by !== signedIn) continue;
			const { outcome, message } = await send(post);
			if (outcome === 'unreachable') break;
			if (outcome === 'sent') {
				await db.delete('outbox', post.id);
				sent.push(post);
			} else await db.put('outbox', { ...post, refusal: message });
		}
		announce();
		return sent;
	})().finally(() => (sending = null));
	return sending;
}
