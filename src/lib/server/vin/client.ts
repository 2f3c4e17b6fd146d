// Client for the hosted VIN-decoding service. The check digit and model year never depend on it
// (they are worked out locally); it only adds make, model and body. Any failure degrades to
// "decoder unavailable" and never breaks a lookup.
import { z } from 'zod';
import { config } from '../config';

export type DecodedVehicle = { make: string; model: string; modelYear: number | null; body: string | null };

export type DecodeResult =
	| { status: 'found'; vehicle: DecodedVehicle }
	| { status: 'unknown' }
	| { status: 'unavailable'; reason: string };

/**
 * The service's answer to `GET {base}/v1/vins/{vin}`: every vehicle it knows for the VIN, best first,
 * an empty list when it knows none.
 */
export const decoderAnswerSchema = z.object({
	vin: z.string(),
	vehicles: z.array(
		z.object({
			make: z.string().min(1),
			model: z.string().min(1),
			modelYear: z.number().int().nullable(),
			body: z.string().nullable()
		})
	)
});
export type DecoderAnswer = z.infer<typeof decoderAnswerSchema>;

type DecoderSettings = { url: string; timeoutMs: number; apiKey: string | null };

export async function decodeVin(
	vin: string,
	opts: Partial<DecoderSettings> & { fetch?: typeof fetch } = {}
): Promise<DecodeResult> {
	const { url, timeoutMs, apiKey } = config.vin;
	const settings = { url, timeoutMs, apiKey, ...opts };
	const doFetch = opts.fetch ?? fetch;
	let res: Response;
	try {
		res = await doFetch(`${settings.url}/v1/vins/${encodeURIComponent(vin)}`, {
			headers: { accept: 'application/json', ...(settings.apiKey ? { authorization: `Bearer ${settings.apiKey}` } : {}) },
			signal: AbortSignal.timeout(settings.timeoutMs)
		});
	} catch (err) {
		const timedOut = err instanceof Error && (err.name === 'TimeoutError' || err.name === 'AbortError');
		return { status: 'unavailable', reason: timedOut ? `no answer within ${settings.timeoutMs / 1000} s` : 'the service could not be reached' };
	}
	if (res.status === 404) return { status: 'unknown' };
	if (!res.ok) {
		await res.body?.cancel().catch(() => undefined);
		return { status: 'unavailable', reason: `the service answered ${res.status}` };
	}
	let body: unknown;
	try {
		body = await res.json();
	} catch {
		return { status: 'unavailable', reason: 'the service sent an answer that is not JSON' };
	}
	const parsed = decoderAnswerSchema.safeParse(body);
	if (!parsed.success) return { status: 'unavailable', reason: 'the service sent an answer in an unexpected shape' };
	const [first] = parsed.data.vehicles;
	return first ? { status: 'found', vehicle: first } : { status: 'unknown' };
}
