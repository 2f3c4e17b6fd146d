import { formatWhen } from './shopTime';

/** A moderator's pause on someone's editing, as the paused person and the guard see it. */
export type EditBlock = { reason: string; until: string };

export function blockNotice(block: EditBlock, zone?: string): string {
	return `Your editing is paused until ${formatWhen(block.until, zone)}, because: ${block.reason} — if you think this is a mistake, talk to a moderator or the shop owner.`;
}
