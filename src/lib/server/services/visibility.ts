// What one person may read of a page: its revision, a given revision, its photos. Every reader of page
// content goes through here (see DEVELOPERS.md, "Who reads what"); bulk readers use readingRules.ts.
import { QueryTypes } from 'sequelize';
import { db } from '../db';
import { mayReadRevision, readsHidden, readsUnsignedOff, type Reader } from '../../domain/visibility';
import { revisionById, type StoredRevision } from './revisions';
import type { VehicleSummary } from './vehicles';
import { pageRevisionSql, readableSql, readingRules, rulesKey } from './readingRules';
import { SHARED_STATE_TTL_MS, lookupCache } from '../cache';
import { onRevisionWritten } from '../events';
import { ServiceError } from '../errors';

export type PageRevision = { revision: StoredRevision | null; newerAwaitingReview: boolean };

type PageRow = Pick<VehicleSummary, 'id' | 'latestRevisionId'>;

/**
 * The revision a person reads as the page: the newest they may read. With sign-off required, viewers get
 * the newest signed-off one; `newerAwaitingReview` says a newer change waits for sign-off.
 */
export async function pageRevision(vehicle: PageRow, reader: Reader): Promise<PageRevision> {
	const latestId = vehicle.latestRevisionId;
	if (!latestId) return { revision: null, newerAwaitingReview: false };
	const rules = await readingRules();
	const latest = await revisionById(latestId);
	if (latest && mayReadRevision(latest, reader, rules)) return { revision: latest, newerAwaitingReview: false };
	const [row] = await db().query<{ id: number | string | null }>(`SELECT ${pageRevisionSql('v', reader, rules)} AS id FROM vehicles v WHERE v.id = :id`, {
		replacements: { id: vehicle.id },
		type: QueryTypes.SELECT
	});
	const id = row?.id ? Number(row.id) : null;
	const revision = id ? await revisionById(id) : null;
	// The flags were read twice (SQL, then the kept copy): trust only a revision both agree on.
	const readable = revision && mayReadRevision(revision, reader, rules) ? revision : null;
	return { revision: readable, newerAwaitingReview: !readsUnsignedOff(reader, rules) && readable?.id !== latestId };
}

/** The page's revision for this person, or a 404 that says no more than that there is nothing to read. */
export async function requirePageRevision(vehicle: PageRow, reader: Reader): Promise<StoredRevision> {
	const { revision, newerAwaitingReview } = await pageRevision(vehicle, reader);
	if (!revision) {
		throw new ServiceError(newerAwaitingReview ? 'This page is waiting for a moderator to sign it off.' : 'This vehicle page has no saved revision yet.', 404);
	}
	return revision;
}

/** Whether the page exists for this person at all (a viewer does not see a page nobody signed off). */
export async function pageOpenTo(vehicle: PageRow, reader: Reader): Promise<boolean> {
	return (await pageRevision(vehicle, reader)).revision !== null;
}

/** One revision of one page, or null when it is not part of the page or not this person's to read. */
export async function readableRevision(vehicleId: number, revisionId: number, reader: Reader): Promise<StoredRevision | null> {
	const [rev, rules] = await Promise.all([revisionById(revisionId), readingRules()]);
	if (!rev || rev.vehicleId !== vehicleId) return null;
	return mayReadRevision(rev, reader, rules) ? rev : null;
}

/** Whether this person may read a revision (by id), wherever it came from. */
export async function mayRead(revision: StoredRevision, reader: Reader): Promise<boolean> {
	return mayReadRevision(revision, reader, await readingRules());
}

// Whether a photo is open to a kind of reader; any new revision, hide or sign-off here clears it, another
// server's within the shared-state time limit.
const photoOpen = lookupCache<string, boolean>(SHARED_STATE_TTL_MS);
onRevisionWritten(() => photoOpen.clear());

/** Whether one of the revisions showing the photo is open to the person; moderators see every photo. */
export async function photoOpenTo(photoId: string, reader: Reader): Promise<boolean> {
	if (readsHidden(reader)) return true;
	const rules = await readingRules();
	const kind = readsUnsignedOff(reader, rules) ? 'unsigned' : 'signed';
	return photoOpen.get(`${kind}|${rulesKey(rules)}|${photoId}`, async () => {
		const rows = await db().query(
			`SELECT 1 FROM revision_photos rp JOIN revisions r ON r.id = rp.revision_id WHERE rp.photo_id = ? AND ${readableSql('r', reader, rules)} LIMIT 1`,
			{ replacements: [photoId], type: QueryTypes.SELECT }
		);
		return rows.length > 0;
	});
}
