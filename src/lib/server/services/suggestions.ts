// A writer's change to a page locked for moderators: kept with the revision it started from, listed for
// moderators, who apply it through the normal save (so the three-way merge applies) or decline it with a note.
import type { Transaction, WhereOptions } from 'sequelize';
import { db } from '../db';
import { Suggestion, User, Vehicle } from '../db/models';
import { canonicalJson } from '../../domain/content/schema';
import { roleAtLeast } from '../../domain/roles';
import type { SessionUser } from '../../domain/sessionUser';
import { EditConflictError, NoChangeError, ServiceError } from '../errors';
import { conflictViews } from '../../domain/content/conflictViews';
import { config } from '../config';
import { deliverQueuedMail, queueMail } from '../mail/queue';
import { logFailure } from '../observability/log';
import { suggestionAnsweredMail } from '../mail/templates';
import { recordAudit } from './audit';
import { refuseBlockedAuthor } from './blocks';
import { canEditVehicle, contentChanges, revisionById, saveRevision, validateContent, type SaveResult } from './revisions';
import { shopSettings } from './settings';
import { mayRead } from './visibility';
import { vehicleById, type VehicleSummary } from './vehicles';

export type SuggestionStatus = 'open' | 'applied' | 'declined';

/** One suggestion as lists show it. */
export type SuggestionItem = {
	id: number;
	vehicle: { id: number; slug: string; title: string };
	author: { id: number; name: string };
	baseRevisionId: number;
	summary: string;
	status: SuggestionStatus;
	createdAt: string;
	answer: { by: string; at: string; note: string; revisionId: number | null } | null;
};

const NOTE_MAX = 500;

/** Keeps a writer's change to a locked page for a moderator; refused when the page is open to them anyway. */
export async function suggestChange(
	vehicle: VehicleSummary,
	input: { baseRevisionId: number; content: unknown; summary: string },
	author: SessionUser
): Promise<{ id: number }> {
	if (!roleAtLeast(author.role, 'editor')) throw new ServiceError('Suggesting a change needs the editor role.', 403);
	await refuseBlockedAuthor(author.id);
	const content = validateContent(input.content);
	const base = Number.isInteger(input.baseRevisionId) && input.baseRevisionId > 0 ? await revisionById(input.baseRevisionId) : null;
	if (!base || base.vehicleId !== vehicle.id || !(await mayRead(base, author))) {
		throw new ServiceError('The revision you started from is not part of this page. Copy what you typed, then open the editor again.', 400);
	}
	if (canonicalJson(content) === canonicalJson(base.content)) throw new ServiceError('Nothing to suggest: the page already says all of this.', 400);
	return db().transaction(async (transaction) => {
		// Read the lock under the row lock, so a page unlocked meanwhile is saved instead of suggested.
		const row = await Vehicle.findByPk(vehicle.id, { transaction, lock: transaction.LOCK.UPDATE, attributes: ['id', 'protection'] });
		if (!row) throw new ServiceError('That vehicle page no longer exists.', 404);
		if (canEditVehicle(author, row)) {
			throw new ServiceError('This page is open to every writer again: press Save revision to save your change yourself.', 409);
		}
		const kept = await Suggestion.create(
			{ vehicleId: vehicle.id, authorId: author.id, baseRevisionId: base.id, content: canonicalJson(content), summary: input.summary.trim().slice(0, NOTE_MAX) },
			{ transaction }
		);
		return { id: Number(kept.id) };
	});
}

type Row = Suggestion & { author?: User; answerer?: User | null };

async function itemsOf(rows: Row[]): Promise<SuggestionItem[]> {
	const vehicles = new Map<number, VehicleSummary | null>();
	for (const r of rows) if (!vehicles.has(r.vehicleId)) vehicles.set(r.vehicleId, await vehicleById(r.vehicleId));
	return rows.map((r) => {
		const v = vehicles.get(r.vehicleId);
		return {
			id: Number(r.id),
			vehicle: { id: r.vehicleId, slug: v?.slug ?? '', title: v?.title ?? 'a removed page' },
			author: { id: r.authorId, name: r.author?.name ?? 'someone' },
			baseRevisionId: Number(r.baseRevisionId),
			summary: r.summary,
			status: r.status as SuggestionStatus,
			createdAt: r.createdAt.toISOString(),
			answer:
				r.status === 'open' || !r.answeredAt
					? null
					: { by: r.answerer?.name ?? 'a moderator', at: r.answeredAt.toISOString(), note: r.answerNote, revisionId: r.appliedRevisionId === null ? null : Number(r.appliedRevisionId) }
		};
	});
}

const PEOPLE = [
	{ model: User, as: 'author', attributes: ['id', 'name'] },
	{ model: User, as: 'answerer', attributes: ['id', 'name'], required: false }
];

/**
 * Suggestions a person may see: moderators see every one, a writer their own. `open` alone by default;
 * `vehicleId` narrows to one page.
 */
export async function listSuggestions(reader: SessionUser, options: { vehicleId?: number; status?: SuggestionStatus | 'any'; limit?: number } = {}): Promise<SuggestionItem[]> {
	if (!roleAtLeast(reader.role, 'editor')) return [];
	const where: WhereOptions = {};
	const status = options.status ?? 'open';
	if (status !== 'any') Object.assign(where, { status });
	if (options.vehicleId) Object.assign(where, { vehicleId: options.vehicleId });
	if (!roleAtLeast(reader.role, 'moderator')) Object.assign(where, { authorId: reader.id });
	const rows = (await Suggestion.findAll({ where, include: PEOPLE, order: [['createdAt', 'DESC'], ['id', 'DESC']], limit: Math.min(options.limit ?? 50, 200) })) as Row[];
	return itemsOf(rows);
}

/** How many suggestions wait for a moderator on a page (moderators only; others get 0). */
export async function waitingSuggestions(reader: SessionUser, vehicleId: number): Promise<number> {
	if (!roleAtLeast(reader.role, 'moderator')) return 0;
	return Suggestion.count({ where: { vehicleId, status: 'open' } });
}

async function readable(id: number, reader: SessionUser, transaction?: Transaction): Promise<Row> {
	const row = (await Suggestion.findByPk(id, { include: PEOPLE, transaction })) as Row | null;
	// The writer who made it and moderators may read it; anyone else is told it is not there.
	if (!row || !(roleAtLeast(reader.role, 'moderator') || row.authorId === reader.id)) throw new ServiceError('No suggested change with that number.', 404);
	return row;
}

/** One suggestion with what it changes against the revision it started from. */
export async function suggestionDetail(id: number, vehicleId: number, reader: SessionUser, units: 'metric' | 'imperial') {
	const row = await readable(id, reader);
	if (row.vehicleId !== vehicleId) throw new ServiceError('No suggested change with that number on this page.', 404);
	const base = await revisionById(Number(row.baseRevisionId));
	if (!base) throw new ServiceError('The revision this change started from is missing.', 404);
	// A base hidden since (or not signed off for this reader) is never shown through its suggestion.
	if (!(await mayRead(base, reader))) throw new ServiceError('The revision this change started from was hidden by a moderator, so its changes are not shown.', 403);
	const [item] = await itemsOf([row]);
	const suggested = validateContent(JSON.parse(row.content));
	return { ...item, ...contentChanges(base.content, suggested, units) };
}

async function openForAnswer(id: number, moderator: SessionUser): Promise<Row> {
	if (!roleAtLeast(moderator.role, 'moderator')) throw new ServiceError('Applying or declining a suggested change needs the moderator role.', 403);
	const row = await readable(id, moderator);
	if (row.status !== 'open') throw new ServiceError(`This suggested change was already ${row.status} by ${row.answerer?.name ?? 'a moderator'}.`, 409);
	return row;
}

/** Marks an open suggestion answered inside the caller's transaction; another moderator's answer first wins. */
async function markAnswered(id: number, vehicleId: number, fields: { status: 'applied' | 'declined'; note: string; revisionId: number | null }, moderator: SessionUser, transaction: Transaction) {
	const [changed] = await Suggestion.update(
		{ status: fields.status, answeredBy: moderator.id, answeredAt: new Date(), answerNote: fields.note, appliedRevisionId: fields.revisionId },
		{ where: { id, status: 'open' }, transaction }
	);
	if (!changed) throw new ServiceError('Another moderator answered this suggested change a moment ago.', 409);
	await recordAudit(
		{ actorId: moderator.id, action: fields.status === 'applied' ? 'suggestion.apply' : 'suggestion.decline', targetType: 'vehicle', targetId: vehicleId, details: { suggestion: id, reason: fields.note, revision: fields.revisionId } },
		transaction
	);
}

/**
 * Saves the suggested content on top of the revision it started from, as a moderator's save: edits made
 * since are merged in, and a field both changed is refused as a conflict (EditConflictError) for the
 * moderator to settle. The revision and the answered suggestion are written in one transaction.
 */
export async function applySuggestion(id: number, moderator: SessionUser, changeNote: string): Promise<SaveResult> {
	const row = await openForAnswer(id, moderator);
	const note = changeNote.trim().slice(0, NOTE_MAX) || `${row.summary || 'Suggested change'} (suggested by ${row.author?.name ?? 'a writer'})`;
	let saved: SaveResult;
	try {
		saved = await saveRevision(row.vehicleId, { baseRevisionId: Number(row.baseRevisionId), content: JSON.parse(row.content), summary: note }, moderator, (result, transaction) =>
			markAnswered(id, row.vehicleId, { status: 'applied', note: changeNote.trim().slice(0, NOTE_MAX), revisionId: result.revisionId }, moderator, transaction)
		);
	} catch (err) {
		if (err instanceof NoChangeError) throw new ServiceError('The page already says all of this: decline the suggestion with a note instead.', 409);
		throw err;
	}
	await tellWriter(row, moderator, 'applied', changeNote.trim());
	return saved;
}

export async function declineSuggestion(id: number, moderator: SessionUser, note: string): Promise<void> {
	const row = await openForAnswer(id, moderator);
	await db().transaction((transaction) => markAnswered(id, row.vehicleId, { status: 'declined', note: note.trim().slice(0, NOTE_MAX), revisionId: null }, moderator, transaction));
	await tellWriter(row, moderator, 'declined', note.trim());
}

/** The writer hears the answer by mail, through the mail queue (kept and retried while the mail server is down). */
async function tellWriter(row: Row, moderator: SessionUser, outcome: 'applied' | 'declined', note: string): Promise<void> {
	try {
		const [writer, vehicle, shop] = await Promise.all([
			User.findByPk(row.authorId, { attributes: ['email', 'name', 'status'] }),
			vehicleById(row.vehicleId),
			shopSettings()
		]);
		if (!writer || writer.status !== 'active' || !vehicle) return;
		const link = `${config.origin}/vehicles/${vehicle.slug}/suggestions/${row.id}`;
		const mailId = await queueMail({
			to: writer.email,
			...suggestionAnsweredMail({ recipientName: writer.name, moderatorName: moderator.name, vehicleTitle: vehicle.title, outcome, note, link, when: new Date(), timeZone: shop.timeZone })
		});
		await deliverQueuedMail({ ids: [mailId] });
	} catch (err) {
		logFailure('suggestion answer not queued', err);
	}
}

/** Open suggestions awaiting a moderator, oldest first, for the shop log. */
export async function suggestionsAwaiting(reader: SessionUser): Promise<SuggestionItem[]> {
	const items = await listSuggestions(reader, { status: 'open', limit: 100 });
	return items.reverse();
}

/** What the suggestion page shows after a refused apply: the clashing fields and who saved meanwhile. */
export function applyRefusal(refusal: unknown, units: 'metric' | 'imperial') {
	if (!(refusal instanceof EditConflictError)) return { conflicts: [], meanwhile: null };
	return { conflicts: conflictViews(refusal.conflicts, units), meanwhile: refusal.meanwhile };
}
