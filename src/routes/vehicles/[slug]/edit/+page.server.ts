import { error, fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireRole, type SessionUser } from '$lib/server/auth/guard';
import { currentRevision, vehicleBySlug, type VehicleSummary } from '$lib/server/services/vehicles';
import { canEditVehicle, revisionById, saveRevision } from '$lib/server/services/revisions';
import { EditConflictError, NoChangeError, ServiceError } from '$lib/server/errors';
import { contentFromForm, draftFromEntries, formFromContent, type ContentDraft } from '$lib/domain/content/formCodec';
import { applyIntent, readIntent } from '$lib/domain/content/editIntents';
import { conflictViews, type ConflictView } from '$lib/domain/content/conflictViews';
import { applyResolution, type MergeConflict } from '$lib/domain/content/merge';
import { parseContent } from '$lib/domain/content/schema';
import type { LengthUnit } from '$lib/domain/units';

const PROTECTED = 'This page is protected: only moderators can edit it.';

async function editableVehicle(slug: string, user: SessionUser): Promise<VehicleSummary> {
	let found = await vehicleBySlug(slug);
	// A page renamed while someone was editing still takes their save.
	if (found && 'redirectTo' in found) found = await vehicleBySlug(found.redirectTo);
	if (!found || !('vehicle' in found)) error(404, 'No vehicle page at this address.');
	if (!canEditVehicle(user, found.vehicle)) error(403, PROTECTED);
	return found.vehicle;
}

export const load: PageServerLoad = async ({ locals, params, url }) => {
	const user = requireRole(locals, 'editor');
	const found = await vehicleBySlug(params.slug);
	if (!found) error(404, 'No vehicle page at this address.');
	if ('redirectTo' in found) redirect(301, `/vehicles/${found.redirectTo}/edit`);
	const { vehicle } = found;
	if (!canEditVehicle(user, vehicle)) error(403, PROTECTED);
	const revision = await currentRevision(vehicle);
	if (!revision) error(404, 'This vehicle page has no saved revision to edit.');
	const unit: LengthUnit = locals.units === 'imperial' ? 'in' : 'mm';
	return {
		vehicle,
		draft: formFromContent(revision.content, unit),
		unit,
		baseRevisionId: revision.id,
		created: url.searchParams.has('created')
	};
};

interface EditorValues {
	draft: ContentDraft;
	unit: LengthUnit;
	summary: string;
	baseRevisionId: number;
	/** Conflicts still to settle: shown, and posted back as JSON with the save. */
	conflicts: ConflictView[];
	conflictsJson: string;
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

export const actions: Actions = {
	save: async ({ locals, request, params }) => {
		const user = requireRole(locals, 'editor');
		const vehicle = await editableVehicle(params.slug, user);
		const form = await request.formData();
		const entries = [...form.entries()].filter((e): e is [string, string] => typeof e[1] === 'string');
		const unit: LengthUnit = form.get('lengthUnit') === 'in' ? 'in' : 'mm';
		const units = unit === 'in' ? 'imperial' : 'metric';
		const summary = String(form.get('summary') ?? '').slice(0, 500);
		const baseRevisionId = Number(form.get('baseRevisionId'));
		const conflictsJson = String(form.get('conflicts') ?? '');
		const conflicts = readConflicts(conflictsJson);
		const values = (draft: ContentDraft, over: Partial<EditorValues> = {}): EditorValues => ({
			draft,
			unit,
			summary,
			baseRevisionId,
			conflicts: conflictViews(conflicts, units),
			conflictsJson: conflicts.length ? conflictsJson : '',
			...over
		});

		const intent = readIntent(form.get('intent'));
		if (intent.kind !== 'save') {
			// Without scripts, adding a row or switching units comes here; nothing is saved.
			const draft = draftFromEntries(entries);
			const now = applyIntent(draft, intent, unit);
			return {
				values: values(draft, { unit: now }),
				errors: {} as Record<string, string>,
				message: intent.kind === 'stay' ? 'Not saved yet: press Save revision when you are done.' : ''
			};
		}

		const base = Number.isInteger(baseRevisionId) && baseRevisionId > 0 ? await revisionById(baseRevisionId) : null;
		if (!base || base.vehicleId !== vehicle.id) {
			return fail(400, {
				values: values(draftFromEntries(entries)),
				errors: {} as Record<string, string>,
				message: 'The revision you started from is not part of this page. Copy what you typed, then open the editor again.'
			});
		}
		const built = contentFromForm(entries, unit, base.content);
		if (!built.content) {
			const count = Object.keys(built.errors).length;
			return fail(400, {
				values: values(built.draft),
				errors: built.errors,
				message: `${count === 1 ? 'One field needs' : `${count} fields need`} attention; nothing was saved yet.`
			});
		}
		const takeTheirs = conflicts.filter((_, i) => form.get(`resolve.${i}`) === 'theirs');
		const content = takeTheirs.length
			? applyResolution(built.content, takeTheirs, Object.fromEntries(takeTheirs.map((c) => [c.path, 'theirs' as const])))
			: built.content;

		let saved: { revisionId: number; merged: boolean; slug: string };
		try {
			saved = await saveRevision(vehicle.id, { baseRevisionId, content, summary }, user);
		} catch (err) {
			if (err instanceof EditConflictError) {
				const merged = parseContent(err.merged);
				return fail(409, {
					values: values(formFromContent(merged.success ? merged.data : content, unit), {
						baseRevisionId: err.latestRevisionId,
						conflicts: conflictViews(err.conflicts, units),
						conflictsJson: JSON.stringify(err.conflicts)
					}),
					errors: {} as Record<string, string>,
					message: err.message
				});
			}
			if (err instanceof NoChangeError) {
				return fail(400, { values: values(built.draft), errors: {} as Record<string, string>, message: 'No change: the page already says all of this, so nothing was saved.' });
			}
			if (err instanceof ServiceError) {
				const errors: Record<string, string> = {};
				for (const [path, message] of Object.entries(err.fieldErrors ?? {})) errors[built.formPath(path)] ??= message;
				return fail(err.status, { values: values(built.draft), errors, message: err.message });
			}
			throw err;
		}
		const merged = saved.merged ? '&merged=1' : '';
		redirect(303, `/vehicles/${saved.slug}?saved=${saved.revisionId}${merged}`);
	}
};
