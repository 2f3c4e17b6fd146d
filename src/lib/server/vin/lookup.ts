// A VIN typed or pasted anywhere search is offered: what it says by itself (check digit, model year,
// manufacturer code), what the decoding service adds, and which pages it leads to.
import { decodeVinBasics, normalizeVin, vinProblem } from '../../domain/vin';
import { ServiceError } from '../errors';
import type { VinCandidate } from '../search/types';
import { searchIndex } from '../search';
import { decodeVin, type DecodedVehicle, type DecodeResult } from './client';

export type VinLookup = {
	vin: string;
	valid: boolean;
	checkDigit: { expected: string; actual: string };
	modelYear: number | null;
	wmi: string;
	/** Why the VIN cannot be right as typed (check digit, year code), or null. */
	problem: string | null;
	decoded: DecodedVehicle | null;
	decoder: { status: DecodeResult['status']; message: string };
	matches: VinCandidate[];
	/** What a new page for this vehicle would start from, when no page matches. */
	newPage: { make: string; model: string; year: number | null } | null;
};

function decoderMessage(result: DecodeResult): string {
	if (result.status === 'found') {
		const v = result.vehicle;
		return `Decoded as ${v.make} ${v.model}${v.modelYear ? ` (${v.modelYear})` : ''}.`;
	}
	if (result.status === 'unknown') return 'The VIN decoder does not know this vehicle.';
	return `The VIN decoder is unavailable (${result.reason}); the check digit and model year are worked out here all the same.`;
}

/** Throws a 400 ServiceError when the input cannot be a VIN (length, I/O/Q, other characters). */
export async function lookupVin(input: string, decode: (vin: string) => Promise<DecodeResult> = decodeVin): Promise<VinLookup> {
	const vin = normalizeVin(input);
	const formatProblem = vinProblem(vin);
	if (formatProblem) throw new ServiceError(formatProblem, 400);
	const basics = decodeVinBasics(vin, { currentYear: new Date().getUTCFullYear() });
	const result = await decode(vin).catch((err): DecodeResult => ({ status: 'unavailable', reason: err instanceof Error ? err.message : 'error' }));
	const decoded = result.status === 'found' ? result.vehicle : null;
	const year = basics.modelYear ?? decoded?.modelYear ?? null;
	const matches = await searchIndex().vinCandidates(vin, decoded, year);
	return {
		vin,
		valid: basics.valid,
		checkDigit: basics.checkDigit!,
		modelYear: basics.modelYear,
		wmi: basics.wmi!,
		problem: basics.problem,
		decoded,
		decoder: { status: result.status, message: decoderMessage(result) },
		matches,
		newPage: matches.length ? null : { make: decoded?.make ?? '', model: decoded?.model ?? '', year }
	};
}

/** The address of the new-page form filled in from a lookup. */
export function newPageHref(newPage: NonNullable<VinLookup['newPage']>): string {
	const params = new URLSearchParams({ make: newPage.make, model: newPage.model, year: newPage.year ? String(newPage.year) : '' });
	return `/vehicles/new?${params}`;
}
