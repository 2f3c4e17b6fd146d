import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall } from '$lib/server/http';
import { ServiceError } from '$lib/server/errors';
import { awgWire, gaugeLabel, materialBasis, parseAwg } from '$lib/domain/wire';
import { materialSchema } from '$lib/domain/powerInput';
import { wireAmpacityA } from '$lib/domain/fuse';
import { AWG_TABLE_GAUGES } from '$lib/domain/calcInput';


// A rest parameter, so "1/0" can be written as it is: /api/calc/awg/1/0 (or 1%2F0).
export const GET: RequestHandler = ({ locals, params, url }) =>
	apiCall(async () => {
		requireRole(locals, 'viewer');
		let n: number;
		try {
			n = parseAwg(decodedGauge(params.n));
		} catch (err) {
			throw new ServiceError((err as Error).message, 400, { n: (err as Error).message });
		}
		if (!AWG_TABLE_GAUGES.includes(n)) {
			const message = 'The gauge table covers 4/0 to 20 AWG.';
			throw new ServiceError(message, 400, { n: message });
		}
		const read = materialSchema.safeParse(url.searchParams.get('material') ?? undefined);
		if (!read.success) throw new ServiceError(read.error.issues[0].message, 400, { material: read.error.issues[0].message });
		const material = read.data;
		const { awg, diameterMm, areaMm2, ohmsPerKm } = awgWire(n, 20, material);
		const basis = `Diameter from ASTM B258; ${materialBasis(material)}, at 20 °C conductor temperature.`;
		return json({ awg, label: gaugeLabel(n), material, diameterMm, areaMm2, ohmsPerKm, ampacityA: wireAmpacityA(n, material), basis });
	});

/** "1%2F0" arrives still encoded; a stray "%" is read as typed. */
function decodedGauge(text: string): string {
	try {
		return decodeURIComponent(text);
	} catch {
		return text;
	}
}
