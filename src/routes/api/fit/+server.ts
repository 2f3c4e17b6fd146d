import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall, peekJson, readJson } from '$lib/server/http';
import { ServiceError } from '$lib/server/errors';
import { checkVehicleFit, vehiclesForBox, vehiclesForPart } from '$lib/server/services/fit';
import { requirePart } from '$lib/server/services/parts';
import { fitVerdict } from '$lib/domain/fit';
import { fitReason } from '$lib/domain/fitAnswer';
import { againstPageSchema, boxAgainstSpaceSchema, reverseQuerySchema } from '$lib/domain/fitRequest';

/** A box against a typed space, or a part (or box) against a vehicle page's measurements. */
export const POST: RequestHandler = ({ locals, request }) =>
	apiCall(async () => {
		const user = requireRole(locals, 'viewer');
		if ('space' in ((await peekJson(request)) ?? {})) {
			const body = await readJson(request, boxAgainstSpaceSchema);
			const r = fitVerdict(body.box, body.space, { clearanceMm: body.marginMm, tightMm: body.tightMm });
			return json({ verdict: r.verdict, rotated: r.rotated, margins: r.margins, limiting: r.limiting });
		}
		const body = await readJson(request, againstPageSchema);
		const answer = await checkVehicleFit({ ...body, clearanceMm: body.clearanceMm ?? body.marginMm }, user);
		const reason = fitReason(answer, locals.units);
		const head = { vehicle: answer.vehicle, part: answer.part ? { id: answer.part.id, sku: answer.part.sku, name: answer.part.name, kind: answer.part.kind } : null, evidence: answer.evidence };
		if (answer.check === 'seat') {
			const c = answer.chosen;
			if (!c) throw new ServiceError('This page records no seat spaces yet.', 404);
			const r = c.result;
			return json({ check: 'seat', verdict: r.verdict, rotated: r.rotated, margins: r.margins, limiting: r.limiting, seat: c.seat, spaceId: c.spaceId, space: c.space, box: answer.box, clearanceMm: answer.clearanceMm, reason, ...head });
		}
		if (answer.check === 'dash') {
			const r = answer.result;
			return json({ check: 'dash', verdict: r.verdict, margins: r.depthMarginMm === null ? null : { depth: r.depthMarginMm }, limiting: r.depthMarginMm === null ? null : 'depth', needsKit: r.needsKit, reason, dash: answer.dash, ...head });
		}
		const c = answer.chosen;
		if (!c) throw new ServiceError('This page records no speaker locations yet.', 404);
		const r = c.result;
		return json({ check: 'speaker', verdict: r.verdict, margins: r.margins, limiting: r.limiting, needsAdapter: r.needsAdapter, location: c.location, locationId: c.locationId, reason, ...head });
	});

/** The reverse query: GET /api/fit?partId=3 or ?l=300&w=200&h=50 → every vehicle and seat it fits. */
export const GET: RequestHandler = ({ locals, url }) =>
	apiCall(async () => {
		requireRole(locals, 'viewer');
		const parsed = reverseQuerySchema.safeParse(Object.fromEntries(url.searchParams));
		if (!parsed.success) throw new ServiceError('Give partId, or l, w and h in millimetres.', 400);
		const clearance = url.searchParams.get('marginMm');
		const options = clearance === null ? {} : { clearanceMm: Number(clearance) };
		const answer = 'partId' in parsed.data ? await vehiclesForPart(await requirePart(parsed.data.partId), options) : await vehiclesForBox(parsed.data, options);
		return json(answer);
	});
