// The seat-space index each app instance keeps in memory for the reverse fit query: every page's
// latest seat spaces (in SeatSpaceIndex's typed arrays), dash and speaker locations. MariaDB is the
// truth; this copy is loaded once, patched on every revision this process saves, and caught up with
// other instances' saves by a cheap look for changed pages.
import { SeatSpaceIndex, type SeatSpaceRow } from '../../domain/fit';
import { BootSpaceIndex } from '../../domain/bootFit';
import { onRevisionWritten } from '../events';
import { factsAfter, factsOf, pagesTouchedSince, type SeatFact, type VehicleFacts } from './source';

export type { SeatFact, VehicleFacts } from './source';

export type Built = {
	index: SeatSpaceIndex;
	vehicles: VehicleFacts[];
	spaceIds: string[];
	/** Each row's figures as the page holds them (the index keeps single precision). */
	seats: SeatFact[];
	/** Row range of each vehicle in the index, so an edit that keeps the seats' shape is patched in place. */
	ranges: Map<number, { start: number; count: number; vehicle: number }>;
	/** Each vehicle's boot, one row per entry of `vehicles`. */
	boots: BootSpaceIndex;
};

const facts = new Map<number, VehicleFacts>();
let built: Built | null = null;
let loading: Promise<void> | null = null;
let loaded = false;
let lastPoll = 0;
let unsubscribe: (() => void) | null = null;

const POLL_MS = 15_000;
const BATCH = 1000;

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
	built.boots.set(range.vehicle, f.boot);
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
		const batch = await factsAfter(after, BATCH);
		for (const f of batch) remember(f);
		if (batch.length < BATCH) break;
		after = batch[batch.length - 1].vehicleId;
	}
	lastPoll = Date.now();
	loaded = true;
}

async function refreshVehicle(vehicleId: number): Promise<void> {
	const f = await factsOf(vehicleId);
	if (f) remember(f);
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
	for (const v of await pagesTouchedSince(since)) {
		const known = facts.get(v.vehicleId);
		if (v.revisionId !== null && (!known || known.revisionId < v.revisionId)) await refreshVehicle(v.vehicleId);
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
	return { index: new SeatSpaceIndex(rows), vehicles, spaceIds, seats, ranges, boots: new BootSpaceIndex(vehicles.map((v) => v.boot)) };
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
