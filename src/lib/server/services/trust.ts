import { z } from 'zod';
import { Op, QueryTypes } from 'sequelize';
import { db } from '../db';
import { Confirmation, Vehicle } from '../db/models';
import { canonicalJson, FIELD_INFO, type VehicleContent } from '../../domain/content/schema';
import { describePath, parsePath, patternOf, valueAtPath, formatFieldValue } from '../../domain/content/fieldDiff';
import type { UnitSystem } from '../../domain/units';
import type { SessionUser } from '../../domain/sessionUser';
import { roleAtLeast } from '../../domain/roles';
import { revisionById } from './revisions';
import { pageRevision } from './visibility';
import { ServiceError } from '../errors';
import { announceMarks, onMarksChanged, onRevisionWritten } from '../events';
import { SHARED_STATE_TTL_MS, lookupCache } from '../cache';
import type { TrustFlag, TrustSummary } from '../../domain/trust';

// Shown on every page view; this process's confirmations, flags and saves clear it at once.
const summaries = lookupCache<string, TrustSummary>(SHARED_STATE_TTL_MS);
onRevisionWritten(() => summaries.clear());
onMarksChanged(() => summaries.clear());

/** Drops every kept summary, as another server's write does after SHARED_STATE_TTL_MS. */
export const forgetTrustSummaries = () => summaries.clear();

// Installers' marks on a page: "fitted as described" for a revision, or a measurement flagged as
// wrong. A flag stays open while the flagged field still holds the value it had when flagged;
// an edit that changes (or removes) the field closes it, naming the revision that did.

/** A field a flag can name: every measurement on the current revision. */
export type FlagChoice = { path: string; label: string };

const MEASURE_KINDS = new Set(['mm', 'm', 'ohm', 'amp', 'choice', 'flag']);

/** Every measured or chosen field on a page, as paths with their names, for the flag form. */
export function flaggableFields(content: VehicleContent): FlagChoice[] {
	const out: FlagChoice[] = [];
	const walk = (node: unknown, path: string) => {
		if (Array.isArray(node)) {
			for (const entry of node) {
				if (entry && typeof entry === 'object' && typeof (entry as { id?: unknown }).id === 'string') walk(entry, `${path}[${(entry as { id: string }).id}]`);
			}
			return;
		}
		if (node && typeof node === 'object') {
			for (const [key, value] of Object.entries(node)) {
				if (key === 'id' || key === 'photos' || key === 'identity' || key === 'schemaVersion') continue;
				walk(value, path ? `${path}.${key}` : key);
			}
			return;
		}
		const info = FIELD_INFO[patternOf(path)];
		if (info && MEASURE_KINDS.has(info.kind)) out.push({ path, label: describePath(path, content) });
	};
	walk(content, '');
	return out;
}

export const trustMarkSchema = z.object({
	note: z.string({ error: 'The note must be text.' }).trim().max(1000, 'Keep the note under 1000 characters.').default(''),
	revisionId: z.coerce.number({ error: 'Say which revision you checked.' }).int().positive('Say which revision you checked.').optional()
});

export const flagSchema = trustMarkSchema.extend({
	note: z
		.string({ error: 'Say what is wrong.' })
		.trim()
		.min(3, 'Say what is wrong, for example "height is 80 mm with the seat all the way down".')
		.max(1000, 'Keep the note under 1000 characters.'),
	fieldPath: z
		.string({ error: 'Pick the field that is wrong.' })
		.trim()
		.max(200, 'That field path is too long.')
		.transform((p) => (p === '' ? null : p))
		.nullable()
		.default(null)
});

function requireInstaller(user: SessionUser): void {
	if (!roleAtLeast(user.role, 'viewer')) throw new ServiceError('Sign in to mark a page.', 403);
}

async function currentFor(vehicleId: number, user: SessionUser, revisionId?: number) {
	const vehicle = await Vehicle.findByPk(vehicleId);
	if (!vehicle || !vehicle.latestRevisionId) throw new ServiceError('No vehicle page at this address.', 404);
	// A mark is for what the installer read (the revision this person reads as the page): anything else is
	// refused so nobody confirms a page that has since changed.
	const { revision } = await pageRevision({ id: Number(vehicle.id), latestRevisionId: Number(vehicle.latestRevisionId) }, user);
	if (!revision) throw new ServiceError('No vehicle page at this address.', 404);
	if (revisionId !== undefined && revisionId !== revision.id) {
		throw new ServiceError('The page changed since you opened it; read the current revision and mark it again.', 409);
	}
	return revision;
}

/** "Fitted as described": one mark per installer per revision; marking again keeps the first. */
export async function confirmPage(vehicleId: number, input: unknown, user: SessionUser): Promise<{ id: number; created: boolean }> {
	requireInstaller(user);
	const parsed = trustMarkSchema.safeParse(input ?? {});
	if (!parsed.success) throw new ServiceError(parsed.error.issues[0].message, 400, { note: parsed.error.issues[0].message });
	const revision = await currentFor(vehicleId, user, parsed.data.revisionId);
	const result = await db().transaction(async (transaction) => {
		const existing = await Confirmation.findOne({
			where: { vehicleId, revisionId: revision.id, userId: user.id, kind: 'confirm' },
			transaction,
			lock: transaction.LOCK.UPDATE
		});
		if (existing) return { id: Number(existing.id), created: false };
		const row = await Confirmation.create({ vehicleId, revisionId: revision.id, userId: user.id, kind: 'confirm', fieldPath: null, note: parsed.data.note }, { transaction });
		return { id: Number(row.id), created: true };
	});
	announceMarks(vehicleId);
	return result;
}

/** Flags one person may raise on one page in a day, so the flag list stays something a moderator can read. */
export const FLAGS_PER_PAGE_PER_DAY = 10;
const FLAG_WINDOW_MS = 24 * 60 * 60 * 1000;

/** A measurement (or the page as a whole, with no field) flagged as wrong, with a note; once per field and revision. */
export async function flagField(vehicleId: number, input: unknown, user: SessionUser): Promise<{ id: number }> {
	requireInstaller(user);
	const parsed = flagSchema.safeParse(input ?? {});
	if (!parsed.success) {
		const errors: Record<string, string> = {};
		for (const i of parsed.error.issues) errors[String(i.path[0] ?? 'form')] ??= i.message;
		throw new ServiceError(Object.values(errors)[0], 400, errors);
	}
	const revision = await currentFor(vehicleId, user, parsed.data.revisionId);
	const { fieldPath, note } = parsed.data;
	if (fieldPath !== null) {
		const problem = 'Pick a field that is on the current page.';
		try {
			parsePath(fieldPath);
		} catch {
			throw new ServiceError(problem, 400, { fieldPath: problem });
		}
		if (!FIELD_INFO[patternOf(fieldPath)] || valueAtPath(revision.content, fieldPath) === undefined) {
			throw new ServiceError(problem, 400, { fieldPath: problem });
		}
	}
	const row = await db().transaction(async (transaction) => {
		// The page row is locked so two flags sent at once are counted one after the other.
		await Vehicle.findByPk(vehicleId, { transaction, lock: transaction.LOCK.UPDATE });
		const mine = { vehicleId, userId: user.id, kind: 'flag' as const };
		const already = await Confirmation.count({ where: { ...mine, revisionId: revision.id, fieldPath }, transaction });
		if (already > 0) {
			const message = 'You already flagged this on the current revision; a moderator will see it. Add to the page notes if there is more to say.';
			throw new ServiceError(message, 409, { fieldPath: message });
		}
		const since = new Date(Date.now() - FLAG_WINDOW_MS);
		const recent = await Confirmation.count({ where: { ...mine, createdAt: { [Op.gte]: since } }, transaction });
		if (recent >= FLAGS_PER_PAGE_PER_DAY) {
			throw new ServiceError(`You have flagged this page ${FLAGS_PER_PAGE_PER_DAY} times in the last day; a moderator will go through those first.`, 429);
		}
		return Confirmation.create({ ...mine, revisionId: revision.id, fieldPath, note }, { transaction });
	});
	announceMarks(vehicleId);
	return { id: Number(row.id) };
}

const same = (a: unknown, b: unknown) => canonicalJson(a ?? null) === canonicalJson(b ?? null);

/**
 * What the reading view, the fit check and the job sheet show as trust for a page, as of the revision the
 * reader reads as the page (labels and values never come from a revision they may not read).
 */
export async function trustSummary(vehicleId: number, readerRevisionId: number | null, units: UnitSystem = 'metric'): Promise<TrustSummary> {
	return summaries.get(`${vehicleId}:${readerRevisionId}:${units}`, () => computeTrustSummary(vehicleId, readerRevisionId, units));
}

export type MarkRow = {
	id: number | string;
	revisionId: number | string;
	userId: number | string;
	kind: 'confirm' | 'flag';
	fieldPath: string | null;
	note: string;
	createdAt: Date;
	userName: string | null;
};

/**
 * Whether a page has any marks, for a query that reads the page (the reading view's); `vehicleIdSql` names the
 * page's id in that query. Most pages have none, and their view then needs no second query. (Building the marks
 * as JSON inside the page's query cost the database more per view than the rest of that query together.)
 */
export const hasMarksSql = (vehicleIdSql: string) => `EXISTS (SELECT 1 FROM confirmations c WHERE c.vehicle_id = ${vehicleIdSql})`;

/** A page's marks, newest first, with the name of whoever left each. */
export async function pageMarks(vehicleId: number): Promise<MarkRow[]> {
	return db().query<MarkRow>(
		`SELECT c.id, c.revision_id AS revisionId, c.user_id AS userId, c.kind, c.field_path AS fieldPath, c.note, c.created_at AS createdAt, cu.name AS userName
		FROM confirmations c LEFT JOIN users cu ON cu.id = c.user_id WHERE c.vehicle_id = ? ORDER BY c.created_at DESC, c.id DESC`,
		{ replacements: [vehicleId], type: QueryTypes.SELECT }
	);
}

/** The trust summary from a page's marks already read with the page (see pageMarks); shares trustSummary's cache. */
export function trustSummaryFromMarks(vehicleId: number, readerRevisionId: number | null, units: UnitSystem, marks: MarkRow[]): Promise<TrustSummary> {
	return summaries.get(`${vehicleId}:${readerRevisionId}:${units}`, () => summarise(vehicleId, readerRevisionId, units, marks));
}

async function computeTrustSummary(vehicleId: number, currentId: number | null, units: UnitSystem): Promise<TrustSummary> {
	return summarise(vehicleId, currentId, units, await pageMarks(vehicleId));
}

async function summarise(vehicleId: number, currentId: number | null, units: UnitSystem, rows: MarkRow[]): Promise<TrustSummary> {
	const nameOf = (r: MarkRow) => r.userName ?? 'unknown';

	const confirms = rows.filter((r) => r.kind === 'confirm');
	const installers = new Set(confirms.map((r) => r.userId)).size;
	const onCurrent = new Set(confirms.filter((r) => Number(r.revisionId) === currentId).map((r) => r.userId)).size;
	const latest = confirms[0];

	const flags = rows.filter((x) => x.kind === 'flag');
	// The current content is read only when a flag names a field: most pages have none.
	const current = currentId && flags.some((f) => f.fieldPath !== null) ? await revisionById(currentId) : null;
	const openFlags: TrustFlag[] = [];
	let closedFlags = 0;
	for (const r of flags) {
		const path = r.fieldPath;
		let open = true;
		if (path !== null && current) {
			const flagged = await revisionById(Number(r.revisionId));
			open = !!flagged && valueAtPath(current.content, path) !== undefined && same(valueAtPath(flagged.content, path), valueAtPath(current.content, path));
		} else if (path === null) {
			// A flag on the page as a whole stays open until the page changes.
			open = Number(r.revisionId) === currentId;
		}
		if (!open) {
			closedFlags++;
			continue;
		}
		openFlags.push({
			id: Number(r.id),
			fieldPath: path,
			label: path && current ? describePath(path, current.content) : 'The page as a whole',
			note: r.note,
			by: nameOf(r),
			at: r.createdAt.toISOString(),
			revisionId: Number(r.revisionId),
			value: path && current ? formatFieldValue(patternOf(path), valueAtPath(current.content, path), units) : null
		});
	}
	const flagsByField: Record<string, TrustFlag[]> = {};
	for (const f of openFlags) (flagsByField[f.fieldPath ?? ''] ??= []).push(f);

	return {
		vehicleId,
		revisionId: currentId,
		confirmations: {
			installers,
			onCurrentRevision: onCurrent,
			latest: latest ? { by: nameOf(latest), at: latest.createdAt.toISOString(), revisionId: Number(latest.revisionId), note: latest.note } : null
		},
		openFlags,
		flagsByField,
		closedFlags
	};
}
