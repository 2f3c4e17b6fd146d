import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall, readJson } from '$lib/server/http';
import { ServiceError } from '$lib/server/errors';
import { distributionPlan } from '$lib/domain/distribution';
import { distributionInputSchema } from '$lib/domain/calcSchemas';
import { FUSE_CAUTIONS } from '$lib/domain/fuse';
import { gaugeLabel } from '$lib/domain/wire';

export const POST: RequestHandler = ({ locals, request }) =>
	apiCall(async () => {
		requireRole(locals, 'viewer');
		const input = await readJson(request, distributionInputSchema);
		const plan = distributionPlan(input);
		if (!plan.ok) throw new ServiceError(plan.reason, 422);
		const run = (w: { awg: string; gauge: number; fuseA: number; dropPct: number; ampacityA: number; fuseBasis: string }) => ({
			awg: w.awg,
			label: gaugeLabel(w.gauge),
			fuseA: w.fuseA,
			dropPct: w.dropPct,
			ampacityA: w.ampacityA,
			fuseBasis: w.fuseBasis
		});
		return json({
			material: plan.material,
			currentA: plan.currentA,
			main: run(plan.main),
			branches: plan.branches.map((b) => ({ ...run(b.wire), pathDropPct: b.pathDropPct })),
			grounds: plan.grounds.map((g) => ({ awg: g.awg, label: gaugeLabel(g.gauge), lengthM: g.lengthM })),
			commonGround: { awg: plan.commonGround.awg, label: gaugeLabel(plan.commonGround.gauge) },
			remote: plan.remote,
			basis: plan.basis,
			assumptions: plan.assumptions,
			gaps: plan.gaps,
			cautions: FUSE_CAUTIONS
		});
	});
