import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall, readJson } from '$lib/server/http';
import { ServiceError } from '$lib/server/errors';
import { checkVehicleFit, vehicleFitSchema, vehiclesForBox, vehiclesForPart } from '$lib/server/services/fit';
import { requirePart } from '$lib/server/services/parts';
import { fitInputSchema, fitVerdict } from '$lib/domain/fit';
import { seatFitReason, speakerFitReason } from '$lib/domain/fitCheck';

const margin = z
	.number({ error: 'marginMm must be a number of millimetres.' })
	.min(0, 'marginMm cannot be negative.')
	.max(500, 'marginMm over 500 mm looks like a typo.')
	.optional();

const boxAgainstSpace = z.object({
	box: fitInputSchema.shape.box,
	space: fitInputSchema.shape.space,
	marginMm: margin,
	tightMm: margin
});

const againstPage = vehicleFitSchema.safeExtend({ marginMm: margin });

/** A box against a typed space, or a part (or box) against a vehicle page's measurements. */
export const POST: RequestHandler = ({ locals, request }) =>
	apiCall(async () => {
		requireRole(locals, 'viewer');
		const raw = await request
			.clone()
			.json()
			.catch(() => null);
		if (raw && typeof raw === 'object' && 'space' in raw) {
			const body = await readJson(request, boxAgainstSpace);
			const r = fitVerdict(body.box, body.space, { clearanceMm: body.marginMm, tightMm: body.tightMm });
			return json({ verdict: r.verdict, rotated: r.rotated, margins: r.margins, limiting: r.limiting });
		}
		const body = await readJson(request, againstPage);
		const answer = await checkVehicleFit({ ...body, clearanceMm: body.clearanceMm ?? body.marginMm });
		const head = { vehicle: answer.vehicle, part: answer.part ? { id: answer.part.id, sku: answer.part.sku, name: answer.part.name, kind: answer.part.kind } : null, evidence: answer.evidence };
		if (answer.check === 'seat') {
			const c = answer.chosen;
			if (!c) throw new ServiceError('This page records no seat spaces yet.', 404);
			return json({
				check: 'seat',
				verdict: c.result.verdict,
				rotated: c.result.rotated,
				margins: c.result.margins,
				limiting: c.result.limiting,
				seat: c.seat,
				spaceId: c.spaceId,
				space: c.space,
				box: answer.box,
				clearanceMm: answer.clearanceMm,
				reason: seatFitReason(c, locals.units, answer.clearanceMm),
				...head
			});
		}
		if (answer.check === 'dash') {
			const r = answer.result;
			return json({ check: 'dash', verdict: r.verdict, margins: r.depthMarginMm === null ? null : { depth: r.depthMarginMm }, limiting: r.depthMarginMm === null ? null : 'depth', needsKit: r.needsKit, reason: r.reason, dash: answer.dash, ...head });
		}
		const c = answer.chosen;
		if (!c) throw new ServiceError('This page records no speaker locations yet.', 404);
		return json({ check: 'speaker', verdict: c.result.verdict, margins: c.result.margins, limiting: c.result.limiting, needsAdapter: c.result.needsAdapter, location: c.location, locationId: c.locationId, reason: speakerFitReason(c, locals.units), ...head });
	});

const positive = (name: string) => z.coerce.number({ error: `${name} must be a number of millimetres.` }).positive(`${name} must be more than 0 mm.`).max(5000, `${name} over 5000 mm looks like a typo.`);
const reverseQuery = z.union([
	z.object({ partId: z.coerce.number({ error: 'partId must be a catalogue part number.' }).int().positive('partId must be a catalogue part number.') }),
	z.object({ l: positive('l'), w: positive('w'), h: positive('h') })
]);

/** The reverse query: GET /api/fit?partId=3 or ?l=300&w=200&h=50 → every vehicle and seat it fits. */
export const GET: RequestHandler = ({ locals, url }) =>
	apiCall(async () => {
		requireRole(locals, 'viewer');
		const params = Object.fromEntries(url.searchParams);
		const parsed = reverseQuery.safeParse(params);
		if (!parsed.success) throw new ServiceError('Give partId, or l, w and h in millimetres.', 400);
		const clearance = url.searchParams.get('marginMm');
		const options = clearance === null ? {} : { clearanceMm: Number(clearance) };
		const answer = 'partId' in parsed.data ? await vehiclesForPart(await requirePart(parsed.data.partId), options) : await vehiclesForBox(parsed.data, options);
		return json(answer);
	});
