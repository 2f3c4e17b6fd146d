const ID_ALPHABET = 'abcdefghijkmnpqrstuvwxyz23456789';

/** A short id for a new list entry: 10 characters, 50 random bits. */
export function newItemId(): string {
	const bytes = globalThis.crypto.getRandomValues(new Uint8Array(10));
	// 256 is a multiple of the 32-letter alphabet, so every letter is equally likely.
	return Array.from(bytes, (b) => ID_ALPHABET[b % ID_ALPHABET.length]).join('');
}
