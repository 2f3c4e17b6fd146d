/** A moderator's pause on someone's editing, as the paused person and the guard see it. */
export type EditBlock = { reason: string; until: string };

function utc(iso: string): string {
	return iso.slice(0, 16).replace('T', ' ') + ' UTC';
}

export function blockNotice(block: EditBlock): string {
	return `Your editing is paused until ${utc(block.until)}, because: ${block.reason} — if you think this is a mistake, talk to a moderator or the shop owner.`;
}
