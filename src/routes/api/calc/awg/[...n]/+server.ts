import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { apiCall } from '$lib/server/http';
import { ServiceError } from '$lib/server/errors';
import { awgWire, parseAwg } from '$lib/domain/wire';
import { AWG_TABLE_GAUGES } from '$lib/domain/calcInput';

const AWG_BASIS = 'Diameter from ASTM B258; annealed copper resistance from IEC 60028 (1/58 Ω·mm²/m) at 20 °C conductor temperature.';

// A rest parameter, so "1/0" can be written as it is: /api/calc/awg/1/0 (or 1%2F0).
export const GET: RequestHandler = ({ locals, params }) =>
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
		const { awg, diameterMm, areaMm2, ohmsPerKm } = awgWire(n, 20);
		return json({ awg, diameterMm, areaMm2, ohmsPerKm, basis: AWG_BASIS });
	});

/** "1%2F0" arrives still encoded; a stray "%" is read as typed. */
function decodedGauge(text: string): string {
	try {
		return decodeURIComponent(text);
	} catch {
		return text;
	}
}
