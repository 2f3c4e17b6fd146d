// The vehicle page editor as one use case: who may open it, what it starts from, and a posted save
// (typed units, rows added without scripts, conflicts settled field by field) turned into a revision.
import { z } from 'zod';
import type { SessionUser } from '../../domain/sessionUser';
import type { LengthUnit } from '../../domain/units';
import { contentFromForm, draftFromEntries, formFromContent, type ContentDraft, type EditorValues } from '../../domain/content/formCodec';
import { applyIntent, readIntent } from '../../domain/content/editIntents';
import { conflictViews } from '../../domain/content/conflictViews';
import { applyResolution, type MergeConflict } from '../../domain/content/merge';
import { parseContent } from '../../domain/content/schema';
import { EditConflictError, NoChangeError, ServiceError } from '../errors';
import { vehicleBySlug, type VehicleSummary } from './vehicles';
import { canEditVehicle, revisionById, saveRevision } from './revisions';
import { mayRead } from './visibility';
import { suggestChange } from './suggestions';

const PROTECTED = 'This page is locked for moderators: only moderators can edit it.';
const PROTECTED_MEANWHILE =
	'A moderator locked this page while you were editing, so only moderators can save it now. Nothing was saved; everything you typed is still below: press “Suggest this change” to keep it for a moderator to apply.';

/** A save refused because the page was locked for moderators after the editor opened. */
export class LockedMeanwhileError extends ServiceError {
	constructor() {
		super(PROTECTED_MEANWHILE, 403);
	}
}

async function pageAt(slug: string): Promise<VehicleSummary> {
	let found = await vehicleBySlug(slug);
	if (found && 'redirectTo' in found) found = await vehicleBySlug(found.redirectTo);
	if (!found || !('vehicle' in found)) throw new ServiceError('No vehicle page at this address.', 404);
	return found.vehicle;
}

/** The page this person may edit at this address; an address renamed while they were editing still finds it. */
export async function editableVehicle(slug: string, user: SessionUser, saving = false): Promise<VehicleSummary> {
	const vehicle = await pageAt(slug);
	if (!canEditVehicle(user, vehicle)) throw saving ? new LockedMeanwhileError() : new ServiceError(PROTECTED, 403);
	return vehicle;
}

/**
 * The page the editor opens on, and what its button does: save a revision, or, on a page locked for
 * moderators, suggest the change for a moderator to apply.
 */
export async function editorVehicle(slug: string, user: SessionUser): Promise<{ vehicle: VehicleSummary; mode: 'save' | 'suggest' }> {
	const vehicle = await pageAt(slug);
	return { vehicle, mode: canEditVehicle(user, vehicle) ? 'save' : 'suggest' };
}

/** What the editor opens with: the current revision as form text, in the person's length unit. */
export async function editorStart(vehicle: VehicleSummary, unit: LengthUnit): Promise<{ draft: ContentDraft; baseRevisionId: number }> {
	// Editors work on the newest revision, which is never a hidden one.
	const revision = vehicle.latestRevisionId ? await revisionById(vehicle.latestRevisionId) : null;
	if (!revision) throw new ServiceError('This vehicle page has no saved revision to edit.', 404);
	return { draft: formFromContent(revision.content, unit), baseRevisionId: revision.id };
}

const conflictsSchema = z
	.array(z.object({ path: z.string().max(500), label: z.string().max(500), base: z.unknown(), theirs: z.unknown(), yours: z.unknown() }))
	.max(500);

function readConflicts(json: string): MergeConflict[] {
	if (!json) return [];
	try {
		const parsed = conflictsSchema.safeParse(JSON.parse(json));
		return parsed.success ? (parsed.data as MergeConflict[]) : [];
	} catch {
		return [];
	}
}

/** The editor's post, read once: text fields, unit, summary, base revision and conflicts carried along. */
function readPost(posted: FormData) {
	const entries = [...posted.entries()].filter((e): e is [string, string] => typeof e[1] === 'string');
	const unit: LengthUnit = posted.get('lengthUnit') === 'in' ? 'in' : 'mm';
	const conflictsJson = String(posted.get('conflicts') ?? '');
	const conflicts = readConflicts(conflictsJson);
	return {
		entries,
		unit,
		summary: String(posted.get('summary') ?? '').slice(0, 500),
		baseRevisionId: Number(posted.get('baseRevisionId')),
		conflicts,
		conflictsJson: conflicts.length ? conflictsJson : ''
	};
}

const systemOf = (unit: LengthUnit) => (unit === 'in' ? 'imperial' : 'metric');

function valuesOf(post: ReturnType<typeof readPost>, draft: ContentDraft, over: Partial<EditorValues> = {}): EditorValues {
	return {
		draft,
		unit: post.unit,
		summary: post.summary,
		baseRevisionId: post.baseRevisionId,
		conflicts: conflictViews(post.conflicts, systemOf(post.unit)),
		conflictsJson: post.conflictsJson,
		...over
	};
}

/**
 * The editor as it should show again after a refused save: what was typed, or, when someone else saved
 * meanwhile, both edits merged with the clashing fields to settle against their newest revision.
 */
export function editorValuesAfter(posted: FormData, refusal: unknown): EditorValues {
	const post = readPost(posted);
	if (!(refusal instanceof EditConflictError)) {
		return valuesOf(post, draftFromEntries(post.entries), { offerSuggestion: refusal instanceof LockedMeanwhileError });
	}
	const merged = parseContent(refusal.merged);
	return valuesOf(post, merged.success ? formFromContent(merged.data, post.unit) : draftFromEntries(post.entries), {
		baseRevisionId: refusal.latestRevisionId,
		conflicts: conflictViews(refusal.conflicts, systemOf(post.unit)),
		conflictsJson: JSON.stringify(refusal.conflicts),
		meanwhile: refusal.meanwhile
	});
}

export type EditorOutcome =
	| { saved: { revisionId: number; merged: boolean; slug: string } }
	| { saved: null; values: EditorValues; errors: Record<string, string>; message: string };

/**
 * One press of an editor button. Adding a row or switching units (without scripts) changes only the
 * draft; Save builds the content, takes "theirs" where the editor chose it, and saves a revision.
 * Refusals are ServiceErrors with field errors under the form's input names.
 */
export async function submitEditor(vehicle: VehicleSummary, posted: FormData, author: SessionUser): Promise<EditorOutcome> {
	return pressed(posted, 'Save revision', async (post) => {
		const { built, content } = await contentOfPost(vehicle, post, posted, author);
		return { saved: await underInputs(built, () => saveRevision(vehicle.id, { baseRevisionId: post.baseRevisionId, content, summary: post.summary }, author)) };
	});
}

export type SuggestOutcome = { suggested: { id: number; slug: string } } | { suggested: null; values: EditorValues; errors: Record<string, string>; message: string };

/** "Suggest this change" on a page locked for moderators: the typed content is kept for a moderator, not saved. */
export async function submitSuggestion(vehicle: VehicleSummary, posted: FormData, author: SessionUser): Promise<SuggestOutcome> {
	return pressed(posted, 'Suggest this change', async (post) => {
		const { built, content } = await contentOfPost(vehicle, post, posted, author);
		const kept = await underInputs(built, () => suggestChange(vehicle, { baseRevisionId: post.baseRevisionId, content, summary: post.summary }, author));
		return { suggested: { id: kept.id, slug: vehicle.slug } };
	});
}

type Post = ReturnType<typeof readPost>;

/** Adding a row or switching units (without scripts) changes only the draft; the main button does `then`. */
async function pressed<T>(posted: FormData, button: string, then: (post: Post) => Promise<T>): Promise<T | { saved: null; suggested: null; values: EditorValues; errors: Record<string, string>; message: string }> {
	const post = readPost(posted);
	const intent = readIntent(posted.get('intent'));
	if (intent.kind === 'save') return then(post);
	const draft = draftFromEntries(post.entries);
	const unit = applyIntent(draft, intent, post.unit);
	return {
		saved: null,
		suggested: null,
		values: valuesOf(post, draft, { unit }),
		errors: {},
		message: intent.kind === 'stay' ? `Not saved yet: press ${button} when you are done.` : ''
	};
}

/** The posted form as page content on top of its base revision, with "theirs" taken where the editor chose it. */
async function contentOfPost(vehicle: VehicleSummary, post: Post, posted: FormData, author: SessionUser) {
	const { baseRevisionId } = post;
	const base = Number.isInteger(baseRevisionId) && baseRevisionId > 0 ? await revisionById(baseRevisionId) : null;
	if (!base || base.vehicleId !== vehicle.id || !(await mayRead(base, author))) {
		throw new ServiceError('The revision you started from is not part of this page. Copy what you typed, then open the editor again.', 400);
	}
	const built = contentFromForm(post.entries, post.unit, base.content);
	if (!built.content) {
		const count = Object.keys(built.errors).length;
		throw new ServiceError(`${count === 1 ? 'One field needs' : `${count} fields need`} attention; nothing was saved yet.`, 400, built.errors);
	}
	const takeTheirs = post.conflicts.filter((_, i) => posted.get(`resolve.${i}`) === 'theirs');
	const content = takeTheirs.length
		? applyResolution(built.content, takeTheirs, Object.fromEntries(takeTheirs.map((c) => [c.path, 'theirs' as const])))
		: built.content;
	return { built, content };
}

/** A service's refusal with its field errors moved under the form's input names. */
async function underInputs<T>(built: { formPath(path: string): string }, write: () => Promise<T>): Promise<T> {
	try {
		return await write();
	} catch (err) {
		if (err instanceof EditConflictError) throw err;
		if (err instanceof NoChangeError) throw new ServiceError('No change: the page already says all of this, so nothing was saved.', 400);
		if (err instanceof ServiceError) {
			const errors: Record<string, string> = {};
			for (const [path, message] of Object.entries(err.fieldErrors ?? {})) errors[built.formPath(path)] ??= message;
			throw new ServiceError(err.message, err.status, errors);
		}
		throw err;
	}
}
