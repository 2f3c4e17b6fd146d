import type { PageServerLoad } from './$types';
import { requireRole, hasRole } from '$lib/server/auth/guard';
import { listParts, partCounts } from '$lib/server/services/parts';
import { PART_KINDS, partSummary, type PartKind } from '$lib/domain/part';

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireRole(locals, 'viewer');
	const kindParam = url.searchParams.get('kind') ?? '';
	const kind = (PART_KINDS as readonly string[]).includes(kindParam) ? (kindParam as PartKind) : undefined;
	const q = (url.searchParams.get('q') ?? '').trim().slice(0, 100);
	const [parts, counts] = await Promise.all([listParts({ kind, q: q || undefined }), partCounts()]);
	return {
		kind: kind ?? null,
		q,
		counts,
		canManage: hasRole(user, 'moderator'),
		parts: parts.map((p) => ({ id: p.id, kind: p.kind, sku: p.sku, name: p.name, summary: partSummary(p) }))
	};
};
