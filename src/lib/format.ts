/** Date and size formats shared by history, changes and pages. */
export function formatWhen(iso: string | Date): string {
	const d = typeof iso === 'string' ? new Date(iso) : iso;
	return d.toISOString().slice(0, 16).replace('T', ' ') + ' UTC';
}

export function formatSizeDelta(delta: number): string {
	if (delta === 0) return '±0';
	return (delta > 0 ? '+' : '−') + Math.abs(delta).toLocaleString('en');
}
