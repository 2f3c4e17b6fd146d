// What the phone's outbox holds and says: a trust mark or a change to a page, made with no signal,
// waiting to go to the same form action when the network returns.

/** A trust mark (fitted as described, a flag) or a change typed into a page's editor. */
export type WaitingKind = 'mark' | 'edit';

/** The parts of a waiting post these rules read. */
export type WaitingSummary = { id?: number; kind?: WaitingKind; vehicleId?: number; by: number; slug: string };

/** The words a waiting change goes by, on the form and in the banner. */
export const changeLabel = (title: string, suggesting = false) => (suggesting ? `Suggested change to ${title}` : `Change to ${title}`);

/**
 * The waiting posts a new one takes the place of: a person's newer change to a page replaces their
 * older one still waiting (the editor posts the whole page, so the newer holds all of it); marks
 * never replace anything.
 */
export function replacedBy<T extends WaitingSummary>(waiting: readonly T[], incoming: WaitingSummary): T[] {
	if (incoming.kind !== 'edit' || incoming.vehicleId === undefined) return [];
	return waiting.filter((p) => p.kind === 'edit' && p.vehicleId === incoming.vehicleId && p.by === incoming.by);
}

/** The text fields of a form's post, in order; files never wait on the phone. */
export const textFields = (entries: Iterable<[string, unknown]>): [string, string][] =>
	[...entries].filter((entry): entry is [string, string] => typeof entry[1] === 'string');

/** Where a person settles a post the server refused: a change in the editor, a mark on the page. */
export function settleAt(post: Pick<WaitingSummary, 'kind' | 'slug'>): { href: string; text: string } {
	return post.kind === 'edit' ? { href: `/vehicles/${post.slug}/edit`, text: 'Open the editor' } : { href: `/vehicles/${post.slug}`, text: 'Read the page again' };
}

/** What the banner says once waiting posts went through, marks and changes alike. */
export function sentNotice(labels: readonly string[]): string {
	return labels.length ? `Sent from this phone: ${labels.join('; ')}.` : '';
}
