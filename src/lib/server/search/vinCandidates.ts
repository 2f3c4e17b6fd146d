import { slugify, vehicleTitle } from '../../domain/slug';
import { vinPatternMatches, vinPatternSpecificity } from '../../domain/search/vinPattern';
import type { Entry, VinCandidate } from './types';

const MAX_CANDIDATES = 20;

/**
 * Pages a VIN leads to: those whose VIN patterns fit it, and those named by the decoder's make and
 * model (or an alias), kept to pages whose years include the VIN's model year when it is known.
 */
export function vinCandidates(entries: Iterable<Entry | undefined>, vin: string, decoded: { make: string; model: string } | null, modelYear: number | null): VinCandidate[] {
	const decodedMake = decoded ? slugify(decoded.make) : '';
	const decodedModel = decoded ? slugify(decoded.model) : '';
	const decodedFull = decoded ? slugify(`${decoded.make} ${decoded.model}`) : '';
	const found: (VinCandidate & { weight: number; sortKey: string })[] = [];
	for (const e of entries) {
		if (!e) continue;
		if (modelYear !== null && (modelYear < e.yearFrom || modelYear > e.yearTo)) continue;
		const patterns = e.vinPatterns.filter((p) => vinPatternMatches(p, vin));
		const byName =
			!!decoded &&
			((e.makeKey === decodedMake && (e.modelKey === decodedModel || e.aliasKeys.includes(decodedModel))) ||
				e.aliasKeys.includes(decodedFull));
		if (!patterns.length && !byName) continue;
		const weight = (patterns.length ? 100 + Math.max(...patterns.map(vinPatternSpecificity)) : 0) + (byName ? 50 : 0);
		found.push({
			id: e.id,
			slug: e.slug,
			title: vehicleTitle(e),
			yearFrom: e.yearFrom,
			yearTo: e.yearTo,
			body: e.body,
			reason: patterns.length ? 'vin-pattern' : 'decoded',
			weight,
			sortKey: e.sortKey
		});
	}
	found.sort((a, b) => b.weight - a.weight || (a.sortKey < b.sortKey ? -1 : 1));
	return found.slice(0, MAX_CANDIDATES).map(({ weight: _w, sortKey: _s, ...c }) => c);
}
