/** The date format shared by history, the shop log and pages. */
export function formatWhen(iso: string | Date): string {
	const d = typeof iso === 'string' ? new Date(iso) : iso;
	return d.toISOString().slice(0, 16).replace('T', ' ') + ' UTC';
}
