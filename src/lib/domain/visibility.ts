import { roleAtLeast, type Role } from './roles';

/**
 * Who may read what. One rule for every reader: a hidden revision is for moderators and admins only;
 * with sign-off required, a viewer reads only revisions a moderator signed off (or saved before the
 * setting was switched on), and a page with no such revision does not exist for them.
 */
export type ReadingRules = { signOffRequired: boolean; signOffSince: Date | null };

/** The flags of a revision that decide who reads it; they change after it is written, its content never does. */
export type RevisionFlags = { hidden: boolean; reviewedAt: Date | null; createdAt: Date };

export type Reader = { role: Role } | null | undefined;

export const OPEN_RULES: ReadingRules = { signOffRequired: false, signOffSince: null };

export function readsHidden(reader: Reader): boolean {
	return roleAtLeast(reader?.role, 'moderator');
}

/** Editors and up work on changes before anyone signs them off. */
export function readsUnsignedOff(reader: Reader, rules: ReadingRules): boolean {
	return !rules.signOffRequired || roleAtLeast(reader?.role, 'editor');
}

/** Signed off, or saved before sign-off was required (those stay as viewers saw them). */
export function signedOff(rev: RevisionFlags, rules: ReadingRules): boolean {
	if (rev.reviewedAt) return true;
	return !!rules.signOffSince && rev.createdAt.getTime() < rules.signOffSince.getTime();
}

export function mayReadRevision(rev: RevisionFlags, reader: Reader, rules: ReadingRules): boolean {
	if (rev.hidden && !readsHidden(reader)) return false;
	return readsUnsignedOff(reader, rules) || signedOff(rev, rules);
}
