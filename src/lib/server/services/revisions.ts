import { createHash } from 'node:crypto';
import { literal, Op, type Transaction } from 'sequelize';
import { db } from '../db';
import { evenWhileReplicaLags } from '../db/readRouting';
import { Make, RenderedNotesRow, Revision, User, Vehicle, VehicleModel } from '../db/models';
import { canonicalJson, formatZodIssues, parseContent, SECTION_KEYS, type SectionKey, type VehicleContent } from '../../domain/content/schema';
import { mergeContent } from '../../domain/content/merge';
import { fieldChanges, notesChanges } from '../../domain/content/fieldDiff';
import { roleAtLeast, type Role } from '../../domain/roles';
import { vehicleSlug, vehicleTitle } from '../../domain/slug';
import type { SessionUser } from '../../domain/sessionUser';
import { ensureRenderedNotes, NOTES_RENDERER_VERSION, storeRenderedNotes, type RenderedNotes } from './rendering';
import { recordOrigins } from '../history/origins';
import { sectionPart } from '../../domain/origins';
import { recordAudit } from './audit';
import { announceRevision, announceVehicleChange } from '../events';
import { EditConflictError, NoChangeError, ServiceError } from '../errors';
import { refuseBlockedAuthor } from './blocks';
import { SHARED_STATE_TTL_MS, lookupCache } from '../cache';
import { mayReadRevision, readsHidden, type Reader, type ReadingRules } from '../../domain/visibility';
import { namingColumns, refuseTakenName, settlePageName } from './pageName';
import { readingRules, signedOffSql } from './readingRules';
import { shopSettings } from './settings';
import { formatWhen } from '../../domain/shopTime';

export type StoredRevision = {
	id: number;
	vehicleId: number;
	parentId: number | null;
	authorId: number;
	authorName: string;
	summary: string;
	content: VehicleContent;
	rendered: RenderedNotes;
	sha256: string;
	size: number;
	sizeDelta: number;
	sections: SectionKey[];
	restoresRevisionId: number | null;
	hidden: boolean;
	reviewedAt: Date | null;
	createdAt: Date;
};

// A revision's content never changes once written, so parsed copies are kept in memory. Its flags (hidden,
// signed off) do change, possibly on another app server: they are kept only for the shared-state time limit,
// and this process's own hides and sign-offs clear them at once.
type RevisionContent = Omit<StoredRevision, 'hidden' | 'reviewedAt'>;
type Flags = Pick<StoredRevision, 'hidden' | 'reviewedAt'>;
const contents = new Map<number, RevisionContent>();
const CACHE_LIMIT = 4_000;
const flagCache = lookupCache<number, Flags | null>(SHARED_STATE_TTL_MS, CACHE_LIMIT);

function remember(rev: StoredRevision): StoredRevision {
	rememberContent(rev);
	flagCache.delete(rev.id);
	void flagCache.get(rev.id, async () => ({ hidden: rev.hidden, reviewedAt: rev.reviewedAt }));
	return rev;
}

/** After this process hid, showed or signed off a revision. */
export function forgetRevisionFlags(id: number): void {
	flagCache.delete(id);
}

/** Forgets every kept flag, as a fresh app server would start. */
export function forgetAllRevisionFlags(): void {
	flagCache.clear();
}

async function revisionFlags(id: number): Promise<Flags | null> {
	return flagCache.get(id, async () => {
		const row = await evenWhileReplicaLags(() => Revision.findByPk(id, { attributes: ['hidden', 'reviewedAt'] }));
		return row ? { hidden: !!row.hidden, reviewedAt: row.reviewedAt ?? null } : null;
	});
}

function toStored(row: Revision & { author?: User | null }, content: VehicleContent, rendered: RenderedNotes): StoredRevision {
	return {
		id: Number(row.id),
		vehicleId: row.vehicleId,
		parentId: row.parentId === null ? null : Number(row.parentId),
		authorId: row.authorId,
		authorName: row.author?.name ?? 'unknown',
		summary: row.summary,
		content,
		rendered,
		sha256: row.sha256,
		size: row.size,
		sizeDelta: row.sizeDelta,
		sections: (row.sections ? row.sections.split(',') : []) as SectionKey[],
		restoresRevisionId: row.restoresRevisionId === null ? null : Number(row.restoresRevisionId),
		hidden: !!row.hidden,
		reviewedAt: row.reviewedAt ?? null,
		createdAt: row.createdAt
	};
}

export async function revisionById(id: number, transaction?: Transaction): Promise<StoredRevision | null> {
	const hit = contents.get(id);
	if (hit && !transaction) {
		const flags = await revisionFlags(id);
		return flags ? { ...hit, ...flags } : null;
	}
	const read = () =>
		Revision.findByPk(id, {
			include: [
				{ model: User, as: 'author', attributes: ['name'] },
				{ model: RenderedNotesRow, as: 'renderedNotes', where: { rendererVersion: NOTES_RENDERER_VERSION }, required: false, attributes: ['notes'] }
			],
			transaction
		});
	const row = transaction ? await read() : await evenWhileReplicaLags(read);
	if (!row) return null;
	// Notes are kept by content and renderer: missing after a renderer change, they are rendered once more here.
	const kept = (row as Revision & { renderedNotes?: RenderedNotesRow | null }).renderedNotes;
	const content = JSON.parse(row.content) as VehicleContent;
	const rendered = kept ? (JSON.parse(kept.notes) as RenderedNotes) : await storeRenderedNotes(row.sha256, content, transaction);
	const stored = toStored(row, content, rendered);
	// Read inside a transaction, the flags may not be committed yet: keep only the content.
	if (!transaction) return remember(stored);
	rememberContent(stored);
	return stored;
}

function rememberContent(rev: StoredRevision): void {
	const { hidden: _hidden, reviewedAt: _reviewedAt, ...content } = rev;
	if (contents.size >= CACHE_LIMIT) contents.delete(contents.keys().next().value!);
	contents.set(rev.id, content);
}

export function validateContent(input: unknown): VehicleContent {
	const parsed = parseContent(input);
	if (!parsed.success) {
		const errors = formatZodIssues(parsed.error);
		const first = Object.entries(errors)[0];
		throw new ServiceError(`Some fields need attention: ${first ? first[1] : 'the page is not valid.'}`, 400, errors);
	}
	return parsed.data;
}

export function canEditVehicle(user: SessionUser | null, vehicle: Pick<Vehicle, 'protection'>): boolean {
	if (!roleAtLeast(user?.role, 'editor')) return false;
	return vehicle.protection !== 'moderators' || roleAtLeast(user?.role, 'moderator');
}

function changedSections(before: VehicleContent | null, after: VehicleContent): SectionKey[] {
	if (!before) return [...SECTION_KEYS];
	const keys = new Set<SectionKey>();
	for (const c of fieldChanges(before, after)) keys.add(c.section as SectionKey);
	for (const n of notesChanges(before, after)) keys.add(n.section as SectionKey);
	if (canonicalJson(before.photos) !== canonicalJson(after.photos)) {
		for (const p of [...before.photos, ...after.photos]) keys.add(p.section as SectionKey);
	}
	return SECTION_KEYS.filter((k) => keys.has(k));
}

/** Writes one revision and moves the page to it; the caller holds the vehicle row lock. */
async function insertRevision(
	vehicle: Vehicle,
	previous: StoredRevision | null,
	content: VehicleContent,
	meta: { authorId: number; authorRole: Role; summary: string; restoresRevisionId?: number | null },
	transaction: Transaction
): Promise<Revision> {
	const json = canonicalJson(content);
	const sha256 = createHash('sha256').update(json).digest('hex');
	const size = Buffer.byteLength(json);
	const sections = changedSections(previous?.content ?? null, content);
	// A moderator's own edit needs no second look.
	const selfReviewed = roleAtLeast(meta.authorRole, 'moderator');
	const row = await Revision.create(
		{
			vehicleId: vehicle.id,
			parentId: previous?.id ?? null,
			authorId: meta.authorId,
			summary: meta.summary.slice(0, 500),
			content: json,
			// Notes live in rendered_notes, shared by every revision with this content.
			rendered: '',
			sha256,
			size,
			sizeDelta: size - (previous?.size ?? 0),
			sections: sections.join(','),
			restoresRevisionId: meta.restoresRevisionId ?? null,
			reviewedBy: selfReviewed ? meta.authorId : null,
			reviewedAt: selfReviewed ? new Date() : null
		},
		{ transaction }
	);
	await ensureRenderedNotes(sha256, content, transaction);
	await recordOrigins(db(), { id: Number(row.id), parentId: previous?.id ?? null, content, sections }, transaction);
	const photoIds = [...new Set(content.photos.map((p) => p.id))];
	if (photoIds.length) {
		await db().query(`INSERT IGNORE INTO revision_photos (photo_id, revision_id) VALUES ${photoIds.map(() => '(?, ?)').join(', ')}`, {
			replacements: photoIds.flatMap((id) => [id, Number(row.id)]),
			transaction
		});
	}
	await refuseTakenName(Number(vehicle.id), content.identity, transaction);
	await vehicle.update({ latestRevisionId: Number(row.id) }, { transaction });
	await settlePageName(vehicle, transaction);
	return row;
}

export async function createVehicle(input: unknown, author: SessionUser, summary = 'New page'): Promise<{ slug: string; revisionId: number }> {
	if (!roleAtLeast(author.role, 'editor')) throw new ServiceError('Creating a page needs the editor role.', 403);
	await refuseBlockedAuthor(author.id);
	const content = validateContent(input);
	const result = await db().transaction(async (transaction) => {
		const slug = vehicleSlug(content.identity);
		if (await Vehicle.findOne({ where: { slug }, transaction })) {
			throw new ServiceError('A page for that make, model, years and body already exists.', 409, {
				'identity.model': 'A page with this make, model, year range and body already exists.'
			});
		}
		const vehicle = await Vehicle.create({ ...(await namingColumns(content.identity, transaction)), latestRevisionId: null }, { transaction });
		const row = await insertRevision(vehicle, null, content, { authorId: author.id, authorRole: author.role, summary: summary || 'New page' }, transaction);
		return { slug: vehicle.slug, revisionId: Number(row.id), vehicleId: vehicle.id };
	});
	await announceRevision({ kind: 'create', vehicleId: result.vehicleId, revisionId: result.revisionId, authorId: author.id });
	return { slug: result.slug, revisionId: result.revisionId };
}

export type SaveInput = { baseRevisionId: number; content: unknown; summary: string };
export type SaveResult = { revisionId: number; merged: boolean; slug: string };

/**
 * Saves an edit made on top of `baseRevisionId`. When someone else saved in between, the two edits are merged
 * field by field; a field both changed differently is refused as a conflict, with everything the editor typed kept.
 */
export async function saveRevision(
	vehicleId: number,
	input: SaveInput,
	author: SessionUser,
	/** More writes that belong to this save, in its transaction (a suggestion marked applied). */
	alongside?: (saved: SaveResult, transaction: Transaction) => Promise<void>
): Promise<SaveResult> {
	await refuseBlockedAuthor(author.id);
	const yours = validateContent(input.content);
	const result = await db().transaction(async (transaction) => {
		const vehicle = await Vehicle.findByPk(vehicleId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!vehicle) throw new ServiceError('That vehicle page no longer exists.', 404);
		if (!canEditVehicle(author, vehicle)) {
			throw new ServiceError(
				vehicle.protection === 'moderators' ? 'This page is locked for moderators: only moderators can edit it.' : 'Editing needs the editor role.',
				403
			);
		}
		const latest = await revisionById(Number(vehicle.latestRevisionId), transaction);
		if (!latest) throw new ServiceError('This page has no current revision to edit.', 409);
		let next = yours;
		let merged = false;
		if (input.baseRevisionId !== latest.id) {
			const base = await revisionById(input.baseRevisionId, transaction);
			// A base the author may not read is refused like one that does not exist: a merge would show its values.
			if (!base || base.vehicleId !== vehicle.id || !mayReadRevision(base, author, await readingRules())) throw new ServiceError('The revision you started from is not part of this page.', 400);
			const outcome = mergeContent(base.content, latest.content, yours);
			if (outcome.conflicts.length) {
				throw new EditConflictError(outcome.conflicts, latest.id, outcome.merged, { by: latest.authorName, at: latest.createdAt.toISOString() });
			}
			next = validateContent(outcome.merged);
			merged = true;
		}
		if (canonicalJson(next) === canonicalJson(latest.content)) throw new NoChangeError();
		const row = await insertRevision(vehicle, latest, next, { authorId: author.id, authorRole: author.role, summary: input.summary.trim() }, transaction);
		const saved = { revisionId: Number(row.id), merged, slug: vehicle.slug };
		if (alongside) await alongside(saved, transaction);
		return saved;
	});
	await announceRevision({ kind: 'save', vehicleId, revisionId: result.revisionId, authorId: author.id });
	return result;
}

/** A restore is a new revision carrying an old one's content; history is never rewritten. */
export async function restoreRevision(vehicleId: number, revisionId: number, actor: SessionUser): Promise<SaveResult> {
	if (!roleAtLeast(actor.role, 'moderator')) throw new ServiceError('Restoring a revision needs the moderator role.', 403);
	const result = await db().transaction(async (transaction) => {
		const vehicle = await Vehicle.findByPk(vehicleId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!vehicle) throw new ServiceError('That vehicle page no longer exists.', 404);
		const target = await revisionById(revisionId, transaction);
		if (!target || target.vehicleId !== vehicle.id) throw new ServiceError('That revision is not part of this page.', 404);
		if (target.hidden) throw new ServiceError('That revision is hidden; unhide it before restoring it.', 409);
		const latest = await revisionById(Number(vehicle.latestRevisionId), transaction);
		if (latest && latest.sha256 === target.sha256) throw new ServiceError('The page already matches that revision.', 400);
		const summary = `Restored revision ${target.id} by ${target.authorName} (${formatWhen(target.createdAt, (await shopSettings()).timeZone)})`;
		const row = await insertRevision(vehicle, latest, target.content, { authorId: actor.id, authorRole: actor.role, summary, restoresRevisionId: target.id }, transaction);
		await recordAudit(
			{ actorId: actor.id, action: 'revision.restore', targetType: 'vehicle', targetId: vehicle.id, details: { restored: target.id, newRevision: Number(row.id) } },
			transaction
		);
		return { revisionId: Number(row.id), merged: false, slug: vehicle.slug };
	});
	await announceRevision({ kind: 'restore', vehicleId, revisionId: result.revisionId, authorId: actor.id });
	return result;
}

/**
 * A change to who reads a page's revisions: the page takes the name viewers now read, and other app servers'
 * indexes look for touched pages.
 */
export async function touchVehicle(vehicleId: number, transaction: Transaction, rules?: ReadingRules): Promise<void> {
	const vehicle = await Vehicle.findByPk(vehicleId, { transaction, lock: transaction.LOCK.UPDATE });
	if (vehicle) await settlePageName(vehicle, transaction, rules);
	await db().query('UPDATE vehicles SET updated_at = CURRENT_TIMESTAMP(3) WHERE id = ?', { replacements: [vehicleId], transaction });
}

export async function setRevisionHidden(revisionId: number, hidden: boolean, reason: string, actor: SessionUser): Promise<void> {
	if (!roleAtLeast(actor.role, 'moderator')) throw new ServiceError('Hiding a revision needs the moderator role.', 403);
	const vehicleId = await db().transaction(async (transaction) => {
		const row = await Revision.findByPk(revisionId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!row) throw new ServiceError('That revision does not exist.', 404);
		const vehicle = await Vehicle.findByPk(row.vehicleId, { transaction, lock: transaction.LOCK.UPDATE });
		if (hidden && vehicle && Number(vehicle.latestRevisionId) === Number(row.id)) {
			throw new ServiceError('This is the current revision. Restore an earlier one (or edit the page) first, then hide this one.', 409);
		}
		if (!!row.hidden === hidden) return row.vehicleId;
		await row.update({ hidden }, { transaction });
		await touchVehicle(row.vehicleId, transaction);
		await recordAudit(
			{ actorId: actor.id, action: hidden ? 'revision.hide' : 'revision.unhide', targetType: 'revision', targetId: revisionId, details: { reason, vehicleId: row.vehicleId } },
			transaction
		);
		return row.vehicleId;
	});
	forgetRevisionFlags(revisionId);
	await announceRevision({ kind: hidden ? 'hide' : 'unhide', vehicleId, revisionId, authorId: actor.id });
}

export async function setProtection(vehicleId: number, protection: 'none' | 'moderators', actor: SessionUser): Promise<void> {
	if (!roleAtLeast(actor.role, 'moderator')) throw new ServiceError('Locking a page for moderators needs the moderator role.', 403);
	await db().transaction(async (transaction) => {
		const vehicle = await Vehicle.findByPk(vehicleId, { transaction, lock: transaction.LOCK.UPDATE });
		if (!vehicle) throw new ServiceError('That vehicle page no longer exists.', 404);
		if (vehicle.protection === protection) return;
		const from = vehicle.protection;
		await vehicle.update({ protection }, { transaction });
		await recordAudit({ actorId: actor.id, action: 'vehicle.protect', targetType: 'vehicle', targetId: vehicleId, details: { from, to: protection } }, transaction);
	});
	announceVehicleChange(vehicleId);
}

export type RevisionListItem = {
	id: number;
	parentId: number | null;
	vehicleId: number;
	vehicleSlug: string;
	vehicleTitle: string;
	author: { id: number; name: string };
	summary: string;
	createdAt: string;
	size: number;
	sizeDelta: number;
	sections: SectionKey[];
	hidden: boolean;
	restoresRevisionId: number | null;
	reviewedAt: string | null;
};

export const PAGE_SIZE = 50;

/**
 * Revisions newest first, as `reader` may list them: a hidden one keeps its row with no summary; with
 * sign-off required, a viewer is not told of changes nobody signed off yet.
 */
export async function listRevisions(reader: Reader, filter: {
	vehicleId?: number;
	authorId?: number;
	section?: SectionKey;
	unreviewed?: boolean;
	page?: number;
	pageSize?: number;
}): Promise<{ items: RevisionListItem[]; total: number; page: number; pageSize: number }> {
	const pageSize = Math.min(Math.max(filter.pageSize ?? PAGE_SIZE, 1), 500);
	const page = Math.max(filter.page ?? 1, 1);
	const where: Record<string | symbol, unknown> = {};
	if (filter.vehicleId) where.vehicleId = filter.vehicleId;
	if (filter.authorId) where.authorId = filter.authorId;
	const conditions = [literal(signedOffSql('`Revision`', reader, await readingRules()))];
	if (filter.section) {
		// Revisions that changed the section are those it originates in.
		const part = db().escape(sectionPart(filter.section));
		conditions.push(
			literal(`EXISTS (SELECT 1 FROM revision_origins o WHERE o.revision_id = \`Revision\`.\`id\` AND o.part = ${part} AND o.origin_revision_id = o.revision_id)`)
		);
	}
	where[Op.and] = conditions;
	if (filter.unreviewed) where.reviewedAt = null;
	const { rows, count } = await Revision.findAndCountAll({
		where,
		attributes: ['id', 'parentId', 'vehicleId', 'authorId', 'summary', 'createdAt', 'size', 'sizeDelta', 'sections', 'hidden', 'restoresRevisionId', 'reviewedAt'],
		include: [
			{ model: User, as: 'author', attributes: ['id', 'name'] },
			{
				model: Vehicle,
				as: 'vehicle',
				attributes: ['slug', 'yearFrom', 'yearTo'],
				include: [
					{ model: Make, as: 'make', attributes: ['name'] },
					{ model: VehicleModel, as: 'model', attributes: ['name'] }
				]
			}
		],
		order: [['id', 'DESC']],
		limit: pageSize,
		offset: (page - 1) * pageSize
	});
	const items = rows.map((r) => {
		const v = (r as Revision & { vehicle: Vehicle & { make: Make; model: VehicleModel } }).vehicle;
		const a = (r as Revision & { author: User }).author;
		return {
			id: Number(r.id),
			parentId: r.parentId === null ? null : Number(r.parentId),
			vehicleId: r.vehicleId,
			vehicleSlug: v.slug,
			vehicleTitle: vehicleTitle({ make: v.make.name, model: v.model.name, yearFrom: v.yearFrom, yearTo: v.yearTo }),
			author: { id: a.id, name: a.name },
			summary: r.hidden && !readsHidden(reader) ? '' : r.summary,
			createdAt: r.createdAt.toISOString(),
			size: r.size,
			sizeDelta: r.sizeDelta,
			sections: (r.sections ? r.sections.split(',') : []) as SectionKey[],
			hidden: !!r.hidden,
			restoresRevisionId: r.restoresRevisionId === null ? null : Number(r.restoresRevisionId),
			reviewedAt: r.reviewedAt ? r.reviewedAt.toISOString() : null
		};
	});
	return { items, total: count, page, pageSize };
}

export type Comparison = {
	from: StoredRevision;
	to: StoredRevision;
	changes: ReturnType<typeof fieldChanges>;
	notes: ReturnType<typeof notesChanges>;
	photos: { added: VehicleContent['photos']; removed: VehicleContent['photos'] };
};

export async function compareRevisions(
	vehicleId: number,
	fromId: number,
	toId: number,
	viewer: SessionUser,
	units: 'metric' | 'imperial'
): Promise<Comparison> {
	const [from, to] = await Promise.all([revisionById(fromId), revisionById(toId)]);
	if (!from || !to || from.vehicleId !== vehicleId || to.vehicleId !== vehicleId) {
		throw new ServiceError('Both revisions must belong to this page.', 404);
	}
	const rules = await readingRules();
	if ((from.hidden || to.hidden) && !readsHidden(viewer)) {
		throw new ServiceError('One of these revisions is hidden by a moderator.', 403);
	}
	if (!mayReadRevision(from, viewer, rules) || !mayReadRevision(to, viewer, rules)) {
		throw new ServiceError('Both revisions must belong to this page.', 404);
	}
	return { from, to, ...contentChanges(from.content, to.content, units) };
}

/** Fields, notes and photos that differ between two contents of a page, as the compare screen lists them. */
export function contentChanges(before: VehicleContent, after: VehicleContent, units: 'metric' | 'imperial') {
	const beforePhotos = new Set(before.photos.map((p) => p.id));
	const afterPhotos = new Set(after.photos.map((p) => p.id));
	return {
		changes: fieldChanges(before, after, { units }),
		notes: notesChanges(before, after),
		photos: {
			added: after.photos.filter((p) => !beforePhotos.has(p.id)),
			removed: before.photos.filter((p) => !afterPhotos.has(p.id))
		}
	};
}
