import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { listParts } from '$lib/server/services/parts';

export const load: PageServerLoad = async ({ locals }) => {
	requireRole(locals, 'viewer');
	const amplifiers = (await listParts({ kind: 'amplifier' })).flatMap((p) =>
		p.kind === 'amplifier'
			? [
					{
						id: p.id,
						label: `${p.sku} · ${p.name}`,
						rms4OhmW: p.rms4OhmW,
						rms2OhmW: p.rms2OhmW,
						rms1OhmW: p.rms1OhmW,
						minLoadOhm: p.minLoadOhm,
						bridgeable: p.bridgeable,
						bridgedRmsW: p.bridgedRmsW
					}
				]
			: []
	);
	return { amplifiers };
};
