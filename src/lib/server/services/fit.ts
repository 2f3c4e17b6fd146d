import { Op, QueryTypes } from 'sequelize';
import { z } from 'zod';
import { db } from '../db';
import { Vehicle } from '../db/models';
import {
	DEFAULT_CLEARANCE_MM,
	DEFAULT_TIGHT_MM,
	fitVerdict,
	SEAT_INDEX_SLACK_MM,
	SeatSpaceIndex,
	type Axis,
	type Box,
	type DepthFit,
	type FitVerdict,
	type SeatSpaceRow
} from '../../domain/fit';
import {
	dashFit,
	pickLocation,
	pickSpace,
	seatSpaceFits,
	speakerLocationFits,
	type LocationFit,
	type SpaceFit
} from '../../domain/fitCheck';
import { SEATS, type DashSection, type Seat, type SeatSpace, type SpeakerLocation, type VehicleContent } from '../../domain/content/schema';
import { partBox, partCheck, type Part } from '../../domain/part';
import { vehicleTitle } from '../../domain/slug';
import { measurementOrigins, placeReaders, type Evidence } from './evidence';
import { onRevisionWritten } from '../events';
import { currentRevision, requireVehicle, type VehicleSummary } from './vehicles';
import { requirePart } from './parts';
import { ServiceError } from '../errors';

// ---- The reverse query: every page's latest seat spaces, dash and speaker locations in memory ----

type VehicleFacts = {
	vehicleId: number;
	slug: string;
	title: string;
	revisionId: number;
	seats: { id: string; seat: Seat; l: number | null; w: number | null; h: number | null }[];
	dash: { opening: DashSection['opening']; depthMm: number | null };
	speakers: { id: string; location: string; cutoutMm: number | null; depthMm: number | null }[];
};

type SeatFact = VehicleFacts['seats'][number];

type Built = {
	index: SeatSpaceIndex;
	vehicles: VehicleFacts[];
	spaceIds: string[];
	/** Each row's figures as the page holds them (the index keeps single precision). */
	seats: SeatFact[];
	/** Row range of each vehicle in the index, so an edit that keeps the seats' shape is patched in place. */
	ranges: Map<number, { start: number; count: number; vehicle: number }>;
};

const facts = new Map<number, VehicleFacts>();
let built: Built | null = null;
let loading: Promise<void> | null = null;
let loaded = false;
let lastPoll = 0;
let unsubscribe: (() => void) | null = null;

// Another app instance may have saved pages; a cheap look for changed rows keeps this one honest.
const POLL_MS = 15_000;
const BATCH = 1000;

type FactRow = {
	vehicleId: number;
	slug: string;
	yearFrom: number;
	yearTo: number;
	make: string;
	model: string;
	revisionId: number | string;
	seats: unknown;
	dash: unknown;
	speakers: unknown;
};

const FACTS_SQL = `SELECT v.id AS vehicleId, v.slug, v.year_from AS yearFrom, v.year_to AS yearTo, mk.name AS make, md.name AS model,
	r.id AS revisionId,
	JSON_EXTRACT(r.content, '$.seats.spaces') AS seats,
	JSON_EXTRACT(r.content, '$.dash') AS dash,
	JSON_EXTRACT(r.content, '$.speakers.locations') AS speakers
FROM vehicles v
JOIN makes mk ON mk.id = v.make_id
JOIN models md ON md.id = v.model_id
JOIN revisions r ON r.id = v.latest_revision_id`;

const json = <T>(v: unknown, fallback: T): T => {
	if (v === null || v === undefined) return fallback;
	if (typeof v === 'string') {
		try {
			return (JSON.parse(v) as T) ?? fallback;
		} catch {
			return fallback;
		}
	}
	return v as T;
};

const mmOrNull = (v: unknown): number | null => (typeof v === 'number' && v > 0 && Number.isFinite(v) ? v : null);

function toFacts(row: FactRow): VehicleFacts {
	const seats = json<Partial<SeatSpace>[]>(row.seats, []);
	const dash = json<Partial<DashSection>>(row.dash, {});
	const speakers = json<Partial<SpeakerLocation>[]>(row.speakers, []);
	return {
		vehicleId: Number(row.vehicleId),
		slug: row.slug,
		title: vehicleTitle({ make: row.make, model: row.model, yearFrom: row.yearFrom, yearTo: row.yearTo }),
		revisionId: Number(row.revisionId),
		seats: seats
			.filter((s) => typeof s.id === 'string' && (SEATS as readonly string[]).includes(s.seat as string))
			.map((s) => ({ id: s.id!, seat: s.seat!, l: mmOrNull(s.lengthMm), w: mmOrNull(s.widthMm), h: mmOrNull(s.heightMm) })),
		dash: { opening: dash.opening ?? null, depthMm: mmOrNull(dash.depthMm) },
		speakers: speakers
			.filter((s) => typeof s.id === 'string')
			.map((s) => ({ id: s.id!, location: s.location || 'Unnamed location', cutoutMm: mmOrNull(s.cutoutMm), depthMm: mmOrNull(s.depthMm) }))
	};
}

/** Keeps the newer of two readings of a page: revision ids only grow, so a late, stale read never wins. */
function remember(f: VehicleFacts): void {
	const had = facts.get(f.vehicleId);
	if (had && had.revisionId > f.revisionId) return;
	facts.set(f.vehicleId, f);
	if (!built) return;
	const range = built.ranges.get(f.vehicleId);
	const sameShape =
		range &&
		range.count === f.seats.length &&
		f.seats.every((s, i) => built!.index.seat(range.start + i) === s.seat);
	if (!range || !sameShape) {
		built = null;
		return;
	}
	// Same seats in the same order: overwrite the columns in place (the typed arrays are the index's storage).
	built.vehicles[range.vehicle] = f;
	f.seats.forEach((s, i) => {
		const row = range.start + i;
		built!.index.l[row] = s.l ?? NaN;
		built!.index.w[row] = s.w ?? NaN;
		built!.index.h[row] = s.h ?? NaN;
		built!.spaceIds[row] = s.id;
		built!.seats[row] = s;
	});
}

async function loadAll(): Promise<void> {
	let after = 0;
	for (;;) {
		const rows = await db().query<FactRow>(`${FACTS_SQL} WHERE v.id > :after ORDER BY v.id LIMIT :batch`, {
			replacements: { after, batch: BATCH },
			type: QueryTypes.SELECT
		});
		for (const row of rows) remember(toFacts(row));
		if (rows.length < BATCH) break;
		after = Number(rows[rows.length - 1].vehicleId);
	}
	lastPoll = Date.now();
	loaded = true;
}

async function refreshVehicle(vehicleId: number): Promise<void> {
	const rows = await db().query<FactRow>(`${FACTS_SQL} WHERE v.id = :id`, { replacements: { id: vehicleId }, type: QueryTypes.SELECT });
	if (rows[0]) remember(toFacts(rows[0]));
}

function listen(): void {
	if (unsubscribe) return;
	unsubscribe = onRevisionWritten(async (event) => {
		// Before the first load there is nothing to patch: the load reads the latest anyway.
		if (loaded || loading) await refreshVehicle(event.vehicleId);
	});
}

/** Start-up: listen for saved revisions and build the index in the background. */
export function warmSeatSpaceIndex(): Promise<void> {
	listen();
	loading ??= loadAll().catch((err) => {
		loading = null;
		throw err;
	});
	return loading;
}

async function pollForChanges(): Promise<void> {
	const since = new Date(lastPoll - POLL_MS);
	lastPoll = Date.now();
	const changed = await Vehicle.findAll({ where: { updatedAt: { [Op.gte]: since } }, attributes: ['id', 'latestRevisionId'] });
	for (const v of changed) {
		const known = facts.get(v.id);
		if (v.latestRevisionId !== null && (!known || known.revisionId < Number(v.latestRevisionId))) await refreshVehicle(v.id);
	}
}

function build(): Built {
	const vehicles = [...facts.values()].sort((a, b) => a.title.localeCompare(b.title) || a.vehicleId - b.vehicleId);
	const rows: SeatSpaceRow[] = [];
	const spaceIds: string[] = [];
	const seats: SeatFact[] = [];
	const ranges = new Map<number, { start: number; count: number; vehicle: number }>();
	vehicles.forEach((v, i) => {
		ranges.set(v.vehicleId, { start: rows.length, count: v.seats.length, vehicle: i });
		for (const s of v.seats) {
			rows.push({ vehicleIndex: i, seat: s.seat, l: s.l, w: s.w, h: s.h });
			spaceIds.push(s.id);
			seats.push(s);
		}
	});
	return { index: new SeatSpaceIndex(rows), vehicles, spaceIds, seats, ranges };
}

/** The index as of now: loaded once, patched on every saved revision, caught up with other instances. */
export async function seatSpaceIndex(): Promise<Built> {
	await warmSeatSpaceIndex();
	if (Date.now() - lastPoll > POLL_MS) await pollForChanges();
	built ??= build();
	return built;
}

/** For tests and scripts that change the database underneath: forget everything and load again. */
export function resetSeatSpaceIndex(): void {
	facts.clear();
	built = null;
	loading = null;
	loaded = false;
	lastPoll = 0;
}

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

const reverseOptions = z.object({
	clearanceMm: z.number({ error: 'Clearance must be a number of millimetres.' }).min(0, 'Clearance cannot be negative.').max(500, 'Clearance over 500 mm looks like a typo.').default(DEFAULT_CLEARANCE_MM),
	tightMm: z
		.number({ error: 'The tight threshold must be a number of millimetres.' })
		.min(0, 'The tight threshold cannot be negative.')
		.max(500, 'A tight threshold over 500 mm looks like a typo.')
		.default(DEFAULT_TIGHT_MM)
});

function readOptions(options: { clearanceMm?: number; tightMm?: number }) {
	const parsed = reverseOptions.safeParse(options);
	if (!parsed.success) throw new ServiceError(parsed.error.issues[0].message, 400, { clearanceMm: parsed.error.issues[0].message });
	return parsed.data;
}

const SEAT_ORDER: Readonly<Record<string, number>> = Object.fromEntries(SEATS.map((s, i) => [s, i]));

// Single precision rounds a figure by at most 3e-4 mm below 5000 mm; asking the index for a box
// this much smaller finds every candidate, and fitVerdict on the page's own figures decides.
const INDEX_SLACK_MM = SEAT_INDEX_SLACK_MM;

/** "Which vehicles and seats does this box fit": the index finds the candidates, fitVerdict decides. */
export async function vehiclesForBox(box: Box, options: { clearanceMm?: number; tightMm?: number } = {}): Promise<ReverseAnswer> {
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

const sortRows = <T extends { vehicleTitle: string; seat: string }>(rows: T[]): T[] =>
	rows.sort((a, b) => a.vehicleTitle.localeCompare(b.vehicleTitle) || (SEAT_ORDER[a.seat] ?? 9) - (SEAT_ORDER[b.seat] ?? 9) || a.seat.localeCompare(b.seat));

/** Which vehicles a catalogue part fits: seats for boxes, the dash for head units, locations for speakers. */
export async function vehiclesForPart(part: Part, options: { clearanceMm?: number; tightMm?: number } = {}): Promise<ReverseAnswer> {
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

// ---- One vehicle, one part or box ----

const dim = (what: string) =>
	z.number({ error: `${what} must be a number of millimetres.` }).positive(`${what} must be more than 0 mm.`).max(5000, `${what} over 5000 mm looks like a typo; sizes are in millimetres.`);

export const boxSchema = z.object(
	{ l: dim('Part length'), w: dim('Part width'), h: dim('Part height') },
	{ error: 'The box needs a length, width and height in millimetres: { l, w, h }.' }
);

export const vehicleFitSchema = z
	.object({
		vehicle: z.string({ error: 'Say which vehicle page (its slug).' }).trim().min(1, 'Say which vehicle page (its slug).').max(160),
		partId: z.number({ error: 'partId must be the number of a catalogue part.' }).int('partId must be a whole number.').positive('partId must be the number of a catalogue part.').optional(),
		box: boxSchema.optional(),
		seat: z.string({ error: 'seat must be text, e.g. "passenger".' }).trim().max(64).optional(),
		location: z.string({ error: 'location must be a speaker location id.' }).trim().max(64).optional(),
		clearanceMm: z.number({ error: 'Clearance must be a number of millimetres.' }).min(0, 'Clearance cannot be negative.').max(500, 'Clearance over 500 mm looks like a typo.').optional()
	})
	.refine((v) => v.partId !== undefined || v.box !== undefined, { message: 'Give a catalogue part (partId) or a box ({ l, w, h } in mm).', path: ['partId'] });
export type VehicleFitRequest = z.input<typeof vehicleFitSchema>;

export type VehicleFitAnswer = {
	vehicle: { slug: string; title: string };
	part: Part | null;
	evidence: Evidence | null;
} & (
	| { check: 'seat'; box: Box; clearanceMm: number; chosen: SpaceFit | null; spaces: SpaceFit[] }
	| { check: 'dash'; dash: { opening: DashSection['opening']; depthMm: number | null }; result: DepthFit }
	| { check: 'speaker'; chosen: LocationFit | null; locations: LocationFit[] }
);

/** A part (or a typed box) against one vehicle page's current measurements. */
export async function checkVehicleFit(request: VehicleFitRequest): Promise<VehicleFitAnswer> {
	const parsed = vehicleFitSchema.safeParse(request);
	if (!parsed.success) throw new ServiceError(parsed.error.issues[0].message, 400, { [String(parsed.error.issues[0].path.join('.') || 'form')]: parsed.error.issues[0].message });
	const input = parsed.data;
	const vehicle = await requireVehicle(input.vehicle);
	const rev = await currentRevision(vehicle);
	if (!rev) throw new ServiceError('This page has no revision yet.', 404);
	const part = input.partId !== undefined ? await requirePart(input.partId) : null;
	const check = part ? partCheck(part.kind) : 'seat';
	const origins = await measurementOrigins(vehicle, placeReaders(rev.content));
	const head = { vehicle: { slug: vehicle.slug, title: vehicle.title }, part };
	if (check === 'seat') {
		const box = part ? partBox(part)! : input.box!;
		const clearanceMm = input.clearanceMm ?? DEFAULT_CLEARANCE_MM;
		const spaces = seatSpaceFits(rev.content.seats.spaces, box, { clearanceMm });
		if (input.seat && !spaces.some((s) => s.spaceId === input.seat || s.seat === input.seat)) {
			throw new ServiceError(`This page has no ${input.seat} seat space; it records: ${spaces.map((s) => s.seat).join(', ') || 'none'}.`, 400, { seat: 'No such seat space on this page.' });
		}
		const chosen = pickSpace(spaces, input.seat);
		return { ...head, check, box, clearanceMm, chosen, spaces, evidence: chosen ? origins[`seat:${chosen.spaceId}`] : null };
	}
	if (check === 'dash') {
		const unit = part as Extract<Part, { kind: 'head-unit' }>;
		const dash = { opening: rev.content.dash.opening, depthMm: rev.content.dash.depthMm };
		return { ...head, check, dash, result: dashFit(unit, dash, { clearanceMm: input.clearanceMm }), evidence: origins.dash };
	}
	const speaker = part as Extract<Part, { kind: 'speaker' }>;
	const locations = speakerLocationFits(rev.content.speakers.locations, speaker);
	if (input.location && !locations.some((l) => l.locationId === input.location)) {
		throw new ServiceError('This page has no speaker location with that id.', 400, { location: 'No such speaker location on this page.' });
	}
	const chosen = pickLocation(locations, input.location);
	return { ...head, check, chosen, locations, evidence: chosen ? origins[`speaker:${chosen.locationId}`] : null };
}
