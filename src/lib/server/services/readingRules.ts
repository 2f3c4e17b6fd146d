// The shop's reading rules and their SQL form, for readers that select revisions in bulk (lists, search,
// the fit index). The rule itself is in domain/visibility.ts; these conditions say the same in SQL.
import { db } from '../db';
import { readsHidden, readsUnsignedOff, type Reader, type ReadingRules } from '../../domain/visibility';
import { shopSettings } from './settings';

export async function readingRules(opts: { fresh?: boolean } = {}): Promise<ReadingRules> {
	const s = await shopSettings(opts);
	return { signOffRequired: s.reviewBeforeShow, signOffSince: s.reviewBeforeShowSince ? new Date(s.reviewBeforeShowSince) : null };
}

/** A key that changes whenever what viewers read changes shape: in-memory indexes rebuild when it does. */
export function rulesKey(rules: ReadingRules): string {
	return rules.signOffRequired ? `signoff:${rules.signOffSince?.toISOString() ?? ''}` : 'open';
}

/** SQL: revision `alias` is signed off, or the reader needs no sign-off. */
export function signedOffSql(alias: string, reader: Reader, rules: ReadingRules): string {
	if (readsUnsignedOff(reader, rules)) return '1 = 1';
	const before = rules.signOffSince ? ` OR ${alias}.created_at < ${db().escape(rules.signOffSince)}` : '';
	return `(${alias}.reviewed_at IS NOT NULL${before})`;
}

/** SQL: the reader may read revision `alias` (the SQL twin of mayReadRevision). */
export function readableSql(alias: string, reader: Reader, rules: ReadingRules): string {
	const unhidden = readsHidden(reader) ? '1 = 1' : `${alias}.hidden = 0`;
	return `(${unhidden} AND ${signedOffSql(alias, reader, rules)})`;
}

/** SQL: the id of the revision the reader reads as page `vehicleAlias` (NULL when the page is not open to them). */
export function pageRevisionSql(vehicleAlias: string, reader: Reader, rules: ReadingRules): string {
	return `(SELECT MAX(pr.id) FROM revisions pr WHERE pr.vehicle_id = ${vehicleAlias}.id AND pr.id <= ${vehicleAlias}.latest_revision_id AND ${readableSql('pr', reader, rules)})`;
}

/** SQL: page `vehicleAlias` has a revision the reader may read. */
export function pageOpenSql(vehicleAlias: string, reader: Reader, rules: ReadingRules): string {
	if (readsUnsignedOff(reader, rules)) return `${vehicleAlias}.latest_revision_id IS NOT NULL`;
	return `EXISTS (SELECT 1 FROM revisions pr WHERE pr.vehicle_id = ${vehicleAlias}.id AND ${readableSql('pr', reader, rules)})`;
}

/** Who the shared indexes (search, seat spaces) are built for: the least a signed-in person may read. */
export const INDEX_READER: Reader = { role: 'viewer' };
