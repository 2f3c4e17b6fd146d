// The seat-space index each app instance keeps in memory for the reverse fit query: every page's
// shown seat spaces (the revision every signed-in person may read) (in SeatSpaceIndex's typed arrays), dash and speaker locations. MariaDB is the
// truth; this copy is loaded once, patched on every revision this process saves, and caught up with
// other instances' saves by a cheap look for changed pages.
import { SeatSpaceIndex, type SeatSpaceRow } from '../../domain/fit';
import { BootSpaceIndex } from '../../domain/bootFit';
import { onRevisionWritten } from '../events';
import { readingRules, rulesKey } from '../services/readingRules';
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
/** The reading rules the index was loaded under; a change reloads it. */
let loadedRules = '';

const POLL_MS = 15_000;
const BATCH = 1000;

/**
 * Keeps the newer of two readings of a page: revision ids only grow, so a late, stale read never wins —
 * except a re-read after a hide, which may move the shown revision back (`replace`).
 */
function remember(f: VehicleFacts, replace = false): void {
	const had = facts.get(f.vehicleId);
	if (had && had.revisionId > f.revisionId && !replace) return;
	if (had && had.revisionId > f.revisionId) {
		facts.set(f.vehicleId, f);
		built = null;
		return;
	}
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
	const rules = await readingRules();
	loadedRules = rulesKey(rules);
	for (;;) {
		const batch = await factsAfter(after, BATCH, rules);
		for (const f of batch) remember(f);
		if (batch.length < BATCH) break;
		after = batch[batch.length - 1].vehicleId;
	}
	lastPoll = Date.now();
	loaded = true;
}

async function refreshVehicle(vehicleId: number, replace = false): Promise<void> {
	const f = await factsOf(vehicleId, await readingRules());
	if (f) return remember(f, replace);
	// No revision everyone may read any more: the page leaves the index.
	if (facts.delete(vehicleId)) built = null;
}

function listen(): void {
	if (unsubscribe) return;
	unsubscribe = onRevisionWritten(async (event) => {
		// Before the first load there is nothing to patch: the load reads the latest anyway.
		if (loaded || loading) await refreshVehicle(event.vehicleId, event.kind === 'hide' || event.kind === 'unhide');
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
	// A touched page may have a new revision, or a hide or sign-off that changes which one is shown.
	for (const v of await pagesTouchedSince(since)) await refreshVehicle(v.vehicleId, true);
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
	if (loaded && loadedRules !== rulesKey(await readingRules())) {
		resetSeatSpaceIndex();
		await warmSeatSpaceIndex();
	}
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
