import type { TrustFlag, TrustSummary } from '../../domain/trust';

export type { TrustFlag, TrustSummary };

/** Open flags on a field or anything under it, e.g. one seat space: "seats.spaces[pass1]". */
export function flagsUnder(summary: Pick<TrustSummary, 'openFlags'>, prefix: string): TrustFlag[] {
	return summary.openFlags.filter((f) => f.fieldPath !== null && (f.fieldPath === prefix || f.fieldPath.startsWith(`${prefix}.`) || f.fieldPath.startsWith(`${prefix}[`)));
}

export function installersLine(summary: Pick<TrustSummary, 'confirmations'>): string {
	const c = summary.confirmations;
	if (c.installers === 0) return 'Not confirmed by an installer yet';
	return `Confirmed by ${c.installers} installer${c.installers === 1 ? '' : 's'}`;
}
