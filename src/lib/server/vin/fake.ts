// Local stand-in for the hosted VIN decoder, for development and tests. It speaks the same API the
// client expects (GET /v1/vins/:vin → { vin, vehicles: [...] }) and knows only the invented sample makes.
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { modelYear, normalizeVin, vinProblem } from '../../domain/vin';
import type { LocalService } from '../localService';
import { config } from '../config';
import type { DecoderAnswer } from './client';

/**
 * Illustrative VIN beginnings (manufacturer code plus model characters) for the fictional sample makes. They
 * are not allocated to these makes: their first characters may fall in blocks that belong to real
 * manufacturers, so they are labelled illustrative in the sample-data guide and decode only here.
 * Several match the VIN patterns on the sample pages; a few sample pages record no pattern, so they are
 * found through the decoded make and model; one make has no page at all, to show the "create it" path.
 */
export const FAKE_CATALOGUE: readonly { prefix: string; make: string; model: string; body: string }[] = [
	{ prefix: 'VD1TN', make: 'Veldra', model: 'Tarn', body: 'sedan' },
	{ prefix: 'VD1TS', make: 'Veldra', model: 'Tarn', body: 'sedan' },
	{ prefix: 'VD2MR', make: 'Veldra', model: 'Mirrow', body: 'hatchback' },
	{ prefix: 'KV7BR', make: 'Korvane', model: 'Bristle', body: 'suv' },
	{ prefix: 'KV7BL', make: 'Korvane', model: 'Bristle', body: 'suv' },
	{ prefix: 'KV7PN', make: 'Korvane', model: 'Pennick', body: 'pickup' },
	{ prefix: 'BM4SW', make: 'Brenmoor', model: 'Sallow', body: 'wagon' },
	{ prefix: 'BM9KV', make: 'Brenmoor', model: 'Zennock', body: 'van' },
	{ prefix: 'BM2A', make: 'Brenmoor', model: 'Arrand', body: 'sedan' },
	{ prefix: 'HV3C', make: 'Halvik', model: 'Corrin', body: 'coupe' },
	{ prefix: 'HV8ST', make: 'Halvik', model: 'Stennet', body: 'sedan' },
	{ prefix: 'PL5WR', make: 'Pellinor', model: 'Wrenna', body: 'convertible' },
	{ prefix: 'PL5CD', make: 'Pellinor', model: 'Caddow', body: 'suv' },
	{ prefix: 'PL5CX', make: 'Pellinor', model: 'Caddow', body: 'suv' },
	{ prefix: 'SD2K', make: 'Sundrake', model: 'Kestle', body: 'hatchback' },
	{ prefix: 'SD6T', make: 'Sundrake', model: 'Tallow', body: 'pickup' },
	{ prefix: 'MW1C', make: 'Marrowby', model: 'Cinder', body: 'coupe' },
	{ prefix: 'MW7SC', make: 'Marrowby', model: 'Scree', body: 'other' },
	{ prefix: 'AB3FW', make: 'Ambrel', model: 'Fenwick', body: 'hatchback' }
];

/** What the fake answers for a VIN: the longest matching beginning, or nothing. */
export function fakeDecode(vin: string): DecoderAnswer {
	const best = FAKE_CATALOGUE.filter((e) => vin.startsWith(e.prefix)).sort((a, b) => b.prefix.length - a.prefix.length)[0];
	return {
		vin,
		vehicles: best ? [{ make: best.make, model: best.model, modelYear: modelYear(vin), body: best.body }] : []
	};
}

function listen(server: Server, port: number): Promise<number> {
	return new Promise((resolve, reject) => {
		server.once('error', reject);
		server.listen(port, '127.0.0.1', () => resolve((server.address() as AddressInfo).port));
	});
}

/** Starts the fake on VIN_DECODE_PORT (default 3391; 0 picks a free port). */
export async function startVinDecoderFake(port = config.vin.fakePort) {
	const server = createServer((req, res) => {
		const send = (status: number, body: unknown) => {
			res.writeHead(status, { 'content-type': 'application/json' });
			res.end(JSON.stringify(body));
		};
		const match = /^\/v1\/vins\/([^/?#]+)$/.exec(req.url ?? '');
		if (req.method !== 'GET' || !match) return send(404, { error: 'Not found. Ask GET /v1/vins/{vin}.' });
		const vin = normalizeVin(decodeURIComponent(match[1]));
		const problem = vinProblem(vin);
		if (problem) return send(400, { error: problem });
		send(200, fakeDecode(vin));
	});
	const bound = await listen(server, port);
	return {
		name: 'VIN decoder (local fake)',
		url: `http://127.0.0.1:${bound}`,
		stop: () => new Promise<void>((resolve) => server.close(() => resolve()))
	};
}

// With a hosted decoder configured, the fake stays off.
export const vinDecoderFake: LocalService = {
	start: async () =>
		config.vin.configuredUrl
			? { name: 'VIN decoder: VIN_DECODE_URL is set, so no local fake', url: config.vin.configuredUrl, stop: async () => {} }
			: startVinDecoderFake()
};
