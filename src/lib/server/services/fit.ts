import { fitVerdict, SEAT_INDEX_SLACK_MM, type Axis, type Box, type FitVerdict } from '../../domain/fit';
import { dashFit, speakerLocationFits } from '../../domain/fitCheck';
import { fitAnswer, type FitAnswer, type FitPlaces } from '../../domain/fitAnswer';
import { boxSchema, reverseOptionsSchema, vehicleFitSchema, type ReverseOptions, type VehicleFitRequest } from '../../domain/fitRequest';
import { SEATS, type BootSection } from '../../domain/content/schema';
import { partBox, type Part } from '../../domain/part';
import { measurementOrigins, placeReaders, type Evidence } from './evidence';
import { requireVehicle, type VehicleSummary } from './vehicles';
import { pageRevision } from './visibility';
import type { Reader } from '../../domain/visibility';
import { requirePart } from './parts';
import { seatSpaceIndex } from '../fit';
import { ServiceError } from '../errors';

// Fit checks: one part against one page, and the reverse — every page and place a part goes in.

// ---- One vehicle, one part or box ----

/** A page's current places with who measured each: what the fit screen and the single check read. */
export type VehicleFitFacts = {
	vehicle: VehicleSummary;
	revisionId: number;
	/** The dash also carries its kit notes, which the fit screen shows beside a head unit's answer. */
	places: FitPlaces & { dash: FitPlaces['dash'] & { kit: string }; boot: BootSection };
	evidence: Record<string, Evidence>;
};

/** Null when the page has no revision yet. */
export async function vehicleFitFacts(vehicle: VehicleSummary, reader: Reader): Promise<VehicleFitFacts | null> {
	const { revision: rev } = await pageRevision(vehicle, reader);
	if (!rev) return null;
	const c = rev.content;
	return {
		vehicle,
		revisionId: rev.id,
		places: { seats: c.seats.spaces, dash: { opening: c.dash.opening, depthMm: c.dash.depthMm, openingWidthMm: c.dash.openingWidthMm, openingHeightMm: c.dash.openingHeightMm, kit: c.dash.kit }, speakers: c.speakers.locations, boot: c.boot },
		evidence: await measurementOrigins(rev, placeReaders(c))
	};
}

export type VehicleFitAnswer = FitAnswer<Evidence> & { vehicle: { slug: string; title: string }; part: Part | null };

/** A part (or a typed box) against one vehicle page's current measurements. */
export async function checkVehicleFit(request: VehicleFitRequest, reader: Reader): Promise<VehicleFitAnswer> {
	const parsed = vehicleFitSchema.safeParse(request);
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		throw new ServiceError(issue.message, 400, { [String(issue.path.join('.') || 'form')]: issue.message });
	}
	const input = parsed.data;
	const vehicle = await requireVehicle(input.vehicle);
	const facts = await vehicleFitFacts(vehicle, reader);
	if (!facts) throw new ServiceError('No vehicle page at this address.', 404);
	const part = input.partId !== undefined ? await requirePart(input.partId) : null;
	const where = part?.kind === 'speaker' ? input.location : input.seat;
	const answer = fitAnswer(facts.places, { part, box: input.box, clearanceMm: input.clearanceMm, where }, facts.evidence)!;
	if (!answer.whereFound && answer.check === 'seat') {
		throw new ServiceError(`This page has no ${where} seat space; it records: ${answer.spaces.map((s) => s.seat).join(', ') || 'none'}.`, 400, { seat: 'No such seat space on this page.' });
	}
	if (!answer.whereFound && answer.check === 'speaker') {
		throw new ServiceError('This page has no speaker location with that id.', 400, { location: 'No such speaker location on this page.' });
	}
	return { ...answer, vehicle: { slug: vehicle.slug, title: vehicle.title }, part };
}

// ---- The reverse query: which vehicles and places a part or box goes in ----

export type ReverseRow = {
	vehicleSlug: string;
	vehicleTitle: string;
	revisionId: number;
	/** Seat ("driver"), "dash", or the speaker location's name. */
	seat: string;
	placeId: string;
	verdict: FitVerdict;
	rotated: boolean;
	/** Seat checks: mm left on each axis after clearance. Dash: depth. Speakers: cut-out and depth. */
	margins: Partial<Record<Axis | 'depth' | 'cutout', number>>;
	limiting: string | null;
	needsKit?: boolean;
	needsAdapter?: boolean;
};

export type ReverseAnswer = {
	check: 'seat' | 'dash' | 'speaker';
	clearanceMm: number;
	matches: ReverseRow[];
	notMeasured: { vehicleSlug: string; vehicleTitle: string; seat: string; placeId: string }[];
	searched: { vehicles: number; places: number };
};

function readOptions(options: ReverseOptions) {
	const parsed = reverseOptionsSchema.safeParse(options);
	if (!parsed.success) throw new ServiceError(parsed.error.issues[0].message, 400, { clearanceMm: parsed.error.issues[0].message });
	return parsed.data;
}

const SEAT_ORDER: Readonly<Record<string, number>> = Object.fromEntries(SEATS.map((s, i) => [s, i]));

const sortRows = <T extends { vehicleTitle: string; seat: string }>(rows: T[]): T[] =>
	rows.sort((a, b) => a.vehicleTitle.localeCompare(b.vehicleTitle) || (SEAT_ORDER[a.seat] ?? 9) - (SEAT_ORDER[b.seat] ?? 9) || a.seat.localeCompare(b.seat));

// Single precision rounds a figure by at most 3e-4 mm below 5000 mm; asking the index for a box
// this much smaller finds every candidate, and fitVerdict on the page's own figures decides.
const INDEX_SLACK_MM = SEAT_INDEX_SLACK_MM;

/** "Which vehicles and seats does this box fit": the index finds the candidates, fitVerdict decides. */
export async function vehiclesForBox(box: Box, options: ReverseOptions = {}): Promise<ReverseAnswer> {
	const { clearanceMm, tightMm } = readOptions(options);
	const exact = boxSchema.safeParse(box);
	if (!exact.success) throw new ServiceError(exact.error.issues[0].message, 400);
	const { index, vehicles, spaceIds, seats } = await seatSpaceIndex();
	const loose = { l: Math.max(box.l - INDEX_SLACK_MM, INDEX_SLACK_MM), w: Math.max(box.w - INDEX_SLACK_MM, INDEX_SLACK_MM), h: Math.max(box.h - INDEX_SLACK_MM, INDEX_SLACK_MM) };
	const hits = index.query(loose, clearanceMm, tightMm);
	const matches: ReverseRow[] = [];
	for (const row of hits.rows) {
		const v = vehicles[index.vehicleIndex[row]];
		const seat = seats[row];
		const r = fitVerdict(box, { l: seat.l, w: seat.w, h: seat.h }, { clearanceMm, tightMm });
		if (r.verdict !== 'fits' && r.verdict !== 'tight') continue;
		matches.push({
			vehicleSlug: v.slug,
			vehicleTitle: v.title,
			revisionId: v.revisionId,
			seat: seat.seat,
			placeId: spaceIds[row],
			verdict: r.verdict,
			rotated: r.rotated,
			margins: r.margins,
			limiting: r.limiting
		});
	}
	const notMeasured: ReverseAnswer['notMeasured'] = [];
	for (let row = 0; row < index.size; row++) {
		if (Number.isNaN(index.l[row]) || Number.isNaN(index.w[row]) || Number.isNaN(index.h[row])) {
			const v = vehicles[index.vehicleIndex[row]];
			notMeasured.push({ vehicleSlug: v.slug, vehicleTitle: v.title, seat: index.seat(row), placeId: spaceIds[row] });
		}
	}
	return { check: 'seat', clearanceMm, matches: sortRows(matches), notMeasured, searched: { vehicles: vehicles.length, places: index.size } };
}

/** Which vehicles a catalogue part fits: seats for boxes, the dash for head units, locations for speakers. */
export async function vehiclesForPart(part: Part, options: ReverseOptions = {}): Promise<ReverseAnswer> {
	const box = partBox(part);
	if (box) return vehiclesForBox(box, options);
	const { vehicles } = await seatSpaceIndex();
	const matches: ReverseRow[] = [];
	const notMeasured: ReverseAnswer['notMeasured'] = [];
	let places = 0;
	if (part.kind === 'head-unit') {
		const { clearanceMm, tightMm } = readOptions(options);
		for (const v of vehicles) {
			places++;
			const r = dashFit(part, v.dash, { clearanceMm, tightMm });
			const base = { vehicleSlug: v.slug, vehicleTitle: v.title, seat: 'dash', placeId: 'dash' };
			if (r.verdict === 'not-measured' && r.depthMarginMm === null && v.dash.opening !== 'integrated') notMeasured.push(base);
			else if (r.verdict === 'fits' || r.verdict === 'tight') {
				matches.push({ ...base, revisionId: v.revisionId, verdict: r.verdict, rotated: false, margins: { depth: r.depthMarginMm! }, limiting: 'depth', needsKit: r.needsKit });
			}
		}
		return { check: 'dash', clearanceMm, matches: sortRows(matches), notMeasured, searched: { vehicles: vehicles.length, places } };
	}
	if (part.kind === 'speaker') {
		for (const v of vehicles) {
			for (const f of speakerLocationFits(v.speakers, part)) {
				places++;
				const base = { vehicleSlug: v.slug, vehicleTitle: v.title, seat: f.location, placeId: f.locationId };
				if (f.result.verdict === 'not-measured') notMeasured.push(base);
				else if (f.result.verdict === 'fits' || f.result.verdict === 'tight') {
					matches.push({
						...base,
						revisionId: v.revisionId,
						verdict: f.result.verdict,
						rotated: false,
						margins: f.result.margins!,
						limiting: f.result.limiting,
						needsAdapter: f.result.needsAdapter
					});
				}
			}
		}
		return { check: 'speaker', clearanceMm: 0, matches: sortRows(matches), notMeasured, searched: { vehicles: vehicles.length, places } };
	}
	throw new ServiceError('This kind of part has no fit check.', 400);
}
