import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall, peekJson, readJson } from '$lib/server/http';
import { ServiceError } from '$lib/server/errors';
import { checkBootFit, vehiclesForBootBox, vehiclesForBootPart } from '$lib/server/services/bootFit';
import { BOOT_CAUTION, enclosureFit, enclosureFitReason } from '$lib/domain/bootFit';
import { bootReverseSchema, enclosureAgainstPageSchema, enclosureAgainstSpaceSchema } from '$lib/domain/bootFitRequest';

/** An enclosure through a load opening and into a boot: typed figures, or a part or box against a page. */
export const POST: RequestHandler = ({ locals, request }) =>
	apiCall(async () => {
		const user = requireRole(locals, 'viewer');
		if ('space' in ((await peekJson(request)) ?? {})) {
			const body = await readJson(request, enclosureAgainstSpaceSchema);
			const space = { ...body.space, lTop: body.space.lTop ?? null, archW: body.space.archW ?? null };
			const fit = enclosureFit(body.box, space, body.opening, { clearanceMm: body.marginMm, tightMm: body.tightMm });
			return json({ ...answer(fit), reason: enclosureFitReason(fit, locals.units), caution: BOOT_CAUTION });
		}
		const body = await readJson(request, enclosureAgainstPageSchema);
		const a = await checkBootFit(body, user, locals.units);
		return json({ ...answer(a.fit), reason: a.reason, caution: BOOT_CAUTION, vehicle: a.vehicle, revisionId: a.revisionId, part: a.part, box: a.box });
	});

function answer(fit: ReturnType<typeof enclosureFit>) {
	return { verdict: fit.verdict, throughOpening: fit.throughOpening, opening: fit.opening, margins: fit.margins, limiting: fit.limiting, rotated: fit.rotated, clearanceMm: fit.clearanceMm };
}

/** The reverse question: GET /api/fit/enclosure?partId=3 or ?l=600&w=400&h=350[&lTop=300] → every vehicle whose boot takes it. */
export const GET: RequestHandler = ({ locals, url }) =>
	apiCall(async () => {
		requireRole(locals, 'viewer');
		const parsed = bootReverseSchema.safeParse(Object.fromEntries(url.searchParams));
		if (!parsed.success) throw new ServiceError(parsed.error.issues[0].message, 400);
		const clearance = url.searchParams.get('marginMm');
		const options = clearance === null ? {} : { clearanceMm: Number(clearance) };
		const q = parsed.data;
		return json('partId' in q ? await vehiclesForBootPart(q.partId, options) : await vehiclesForBootBox(q, options));
	});
