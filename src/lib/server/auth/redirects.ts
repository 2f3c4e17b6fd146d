/** Only same-site paths are followed after sign-in, so a crafted link cannot send someone elsewhere. */
export function safeNext(next: string | null | undefined): string {
	if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return '/';
	return next;
}
