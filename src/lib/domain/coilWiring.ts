import { array, boolean, number, object, oneOf, optional, orDefault, refine, whole, type Problem } from './figureRules';
import type { Amplifier } from './part';
import { parallelImpedance, seriesImpedance, seriesParallelImpedance } from './speaker';

// The load an amplifier sees from subwoofers with single or dual voice coils. Impedances combine by
// Ohm's law: in series they add, in parallel 1/Z = Σ 1/Zᵢ (speaker.ts). Nominal impedances are
// treated as resistances, as the trade does when choosing a wiring.

export const MAX_DRIVERS = 8;

/** Drivers of one model: how many, single (1) or dual (2) voice coils, and the impedance of each coil. */
export interface DriverGroup {
	count: number;
	coils: 1 | 2;
	ohmsPerCoil: number;
}

export type CoilWiring = 'single' | 'series' | 'parallel';
export type DriverWiring = 'single' | 'series' | 'parallel' | 'series-parallel';

export interface WiringOption {
	/** The wiring in words: "Coils in series (8 Ω a driver), drivers in parallel". */
	wiring: string;
	/** The final load across the amplifier's terminals (bridged: across both channels). */
	ohms: number;
	/** Bridged only: the load each channel sees, half the bridged load. */
	perSideOhms?: number;
	coilWiring: CoilWiring;
	driverWiring: DriverWiring;
	/** One driver's impedance with its coils wired. */
	driverOhms: number;
	/** Drivers in each series string, and strings in parallel (1 × 1 for a single driver). */
	inSeries: number;
	strings: number;
}

const DRIVER_GROUP = object({
	count: number(
		'Number of drivers must be a whole number.',
		...whole('Number of drivers must be a whole number.'),
		[(n) => n >= 1, 'Give at least 1 driver.'],
		[(n) => n <= MAX_DRIVERS, `At most ${MAX_DRIVERS} drivers on one amplifier channel.`]
	),
	coils: oneOf([1, 2], 'Voice coils must be 1 (single) or 2 (dual).'),
	ohmsPerCoil: number(
		'Impedance per coil must be a number of ohms.',
		[(n) => n > 0, 'Impedance per coil must be more than 0 Ω.'],
		[(n) => n <= 32, 'Impedance per coil over 32 Ω looks like a typo.']
	)
});

/** The groups of drivers on one channel. */
export const DRIVERS = refine(
	array(
		DRIVER_GROUP,
		'Drivers must be a list, for example [{ "count": 2, "coils": 2, "ohmsPerCoil": 4 }].',
		[(n) => n >= 1, 'Give at least one group of drivers.'],
		[(n) => n <= 4, 'At most 4 groups of drivers.']
	),
	(groups, refuse) => {
		// Different drivers on one channel share power unevenly: only identical drivers are combined (common practice).
		if (!groups.every((g) => g.coils === groups[0].coils && g.ohmsPerCoil === groups[0].ohmsPerCoil)) {
			refuse([], 'Wire only identical drivers together: every group needs the same voice coils and impedance per coil.');
		}
		if (groups.reduce((n, g) => n + g.count, 0) > MAX_DRIVERS) {
			refuse([], `At most ${MAX_DRIVERS} drivers on one amplifier channel.`);
		}
	}
);

export const LOAD_INPUT = object({
	drivers: DRIVERS,
	bridged: orDefault(boolean('Bridged must be true or false.'), false),
	partId: optional(number('Part must be a catalogue number.', ...whole('Part must be a catalogue number.'), [(n) => n > 0, 'Part must be a catalogue number.']))
});
export interface LoadInput {
	drivers: DriverGroup[];
	bridged?: boolean;
	partId?: number;
}
export type LoadRequest = Required<Omit<LoadInput, 'partId'>> & Pick<LoadInput, 'partId'>;

/** Identical groups as one: the total count, with the shared coil figures. */
export function mergeDrivers(groups: readonly DriverGroup[]): DriverGroup {
	const first = groups[0];
	return { count: groups.reduce((n, g) => n + g.count, 0), coils: first.coils, ohmsPerCoil: first.ohmsPerCoil };
}

const ohmsText = (ohms: number) => `${Number(ohms.toFixed(3))} Ω`;

function coilWirings(d: DriverGroup): { coilWiring: CoilWiring; driverOhms: number; words: string }[] {
	if (d.coils === 1) return [{ coilWiring: 'single', driverOhms: d.ohmsPerCoil, words: '' }];
	const series = seriesImpedance([d.ohmsPerCoil, d.ohmsPerCoil]);
	const parallel = parallelImpedance([d.ohmsPerCoil, d.ohmsPerCoil]);
	return [
		{ coilWiring: 'series', driverOhms: series, words: `Coils in series (${ohmsText(series)} a driver)` },
		{ coilWiring: 'parallel', driverOhms: parallel, words: `Coils in parallel (${ohmsText(parallel)} a driver)` }
	];
}

/** Every way to make `count` drivers into equal series strings joined in parallel: [in series, strings]. */
function driverArrangements(count: number): [number, number][] {
	const out: [number, number][] = [];
	for (let inSeries = count; inSeries >= 1; inSeries--) if (count % inSeries === 0) out.push([inSeries, count / inSeries]);
	return out;
}

function driverWords(inSeries: number, strings: number): { driverWiring: DriverWiring; words: string } {
	if (inSeries === 1 && strings === 1) return { driverWiring: 'single', words: 'one driver' };
	if (strings === 1) return { driverWiring: 'series', words: `${inSeries} drivers in series` };
	if (inSeries === 1) return { driverWiring: 'parallel', words: `${strings} drivers in parallel` };
	return { driverWiring: 'series-parallel', words: `${strings} strings of ${inSeries} drivers in series, strings in parallel` };
}

/**
 * Every sensible wiring of identical drivers: both coils of each driver wired alike (series or
 * parallel), then the drivers in series, in parallel, or as equal series strings in parallel (unequal
 * strings would share power unevenly). Bridged, each channel sees half the load across the pair.
 */
export function wiringOptions(drivers: readonly DriverGroup[], opts: { bridged?: boolean } = {}): WiringOption[] {
	const problems: Problem[] = [];
	const groups = DRIVERS(drivers, [], problems);
	if (problems.length > 0) throw new RangeError(problems[0].message);
	const d = mergeDrivers(groups);
	const out: WiringOption[] = [];
	for (const coil of coilWirings(d)) {
		for (const [inSeries, strings] of driverArrangements(d.count)) {
			const ohms = seriesParallelImpedance(coil.driverOhms, inSeries, strings);
			const { driverWiring, words } = driverWords(inSeries, strings);
			const wiring = coil.words ? (driverWiring === 'single' ? coil.words : `${coil.words}, ${words}`) : words.charAt(0).toUpperCase() + words.slice(1);
			out.push({
				wiring,
				ohms,
				...(opts.bridged ? { perSideOhms: ohms / 2 } : {}),
				coilWiring: coil.coilWiring,
				driverWiring,
				driverOhms: coil.driverOhms,
				inSeries,
				strings
			});
		}
	}
	return out.sort((a, b) => a.ohms - b.ohms);
}

// ---- Against an amplifier ----

export type AmpLoadFigures = Pick<Amplifier, 'rms4OhmW' | 'rms2OhmW' | 'rms1OhmW' | 'minLoadOhm' | 'bridgeable' | 'bridgedRmsW'>;

/** Taken when the catalogue has no minimum load: 4 Ω, the conservative figure (common practice). */
export const DEFAULT_MIN_LOAD_OHM = 4;
/** The load the maker's bridged figure is rated into. */
export const BRIDGED_RATED_OHM = 4;

export interface AmpLoadCheck {
	ok: boolean;
	/** RMS watts at the nearest rated load at or above the final load; null when there is none. */
	ratedW: number | null;
	/** The rated load the figure is taken at. */
	ratedAtOhm: number | null;
	message: string;
}

const EPS = 1e-9;

const RATED = [
	{ ohms: 4, key: 'rms4OhmW' },
	{ ohms: 2, key: 'rms2OhmW' },
	{ ohms: 1, key: 'rms1OhmW' }
] as const;

/** The rated figure per channel at the lowest rated load at or above `ohms`: never interpolated. */
function ratedAtOrAbove(amp: AmpLoadFigures, ohms: number): { ohms: number; watts: number } | null {
	let best: { ohms: number; watts: number } | null = null;
	for (const r of RATED) {
		const w = amp[r.key];
		if (w !== null && r.ohms >= ohms - EPS && (best === null || r.ohms < best.ohms)) best = { ohms: r.ohms, watts: w };
	}
	return best;
}

/**
 * A final load against an amplifier: each channel's load must not be below the maker's minimum, and
 * the power is the maker's figure at the nearest rated load at or above it, never an estimate between
 * two rated loads. Bridged, each side sees half the load; with no bridged figure the power is twice a
 * channel's rated power at that half load (P = V²/R: twice the voltage across twice the resistance).
 */
export function ampLoadCheck(amp: AmpLoadFigures, ohms: number, bridged = false): AmpLoadCheck {
	if (!(ohms > 0) || !Number.isFinite(ohms)) throw new RangeError(`The load must be more than 0 Ω; got ${ohms}.`);
	if (bridged && !amp.bridgeable) return { ok: false, ratedW: null, ratedAtOhm: null, message: 'This amplifier cannot be bridged: wire the load to one channel.' };
	const perChannel = bridged ? ohms / 2 : ohms;
	const minLoad = amp.minLoadOhm ?? DEFAULT_MIN_LOAD_OHM;
	const minWords = amp.minLoadOhm === null ? `${ohmsText(minLoad)} (no minimum load recorded; taking the conservative 4 Ω)` : ohmsText(minLoad);
	const side = bridged ? `each side sees ${ohmsText(perChannel)}` : `the channel sees ${ohmsText(perChannel)}`;
	if (perChannel < minLoad - EPS) {
		return { ok: false, ratedW: null, ratedAtOhm: null, message: `Too low: ${side}, below the amplifier's minimum stable load of ${minWords}.` };
	}
	const stable = `Stable: ${side}, at or above the minimum of ${minWords}.`;
	if (bridged && amp.bridgedRmsW !== null && ohms <= BRIDGED_RATED_OHM + EPS) {
		return {
			ok: true,
			ratedW: amp.bridgedRmsW,
			ratedAtOhm: BRIDGED_RATED_OHM,
			message: `${stable} Rated ${amp.bridgedRmsW} W RMS bridged at 4 Ω, the nearest rated load at or above ${ohmsText(ohms)} (not interpolated).`
		};
	}
	const rated = ratedAtOrAbove(amp, perChannel);
	if (!rated) {
		const any = RATED.some((r) => amp[r.key] !== null);
		return {
			ok: true,
			ratedW: null,
			ratedAtOhm: null,
			message: any
				? `${stable} No rated figure at or above ${ohmsText(perChannel)}: expect less than the figure at the highest rated load.`
				: `${stable} The catalogue has no rated power at 4, 2 or 1 Ω for this amplifier.`
		};
	}
	const watts = bridged ? 2 * rated.watts : rated.watts;
	return {
		ok: true,
		ratedW: watts,
		ratedAtOhm: rated.ohms,
		message: bridged
			? `${stable} About ${watts} W RMS bridged: twice the ${rated.watts} W a channel is rated at ${ohmsText(rated.ohms)}, the nearest rated load at or above ${ohmsText(perChannel)} (not interpolated).`
			: `${stable} Rated ${watts} W RMS at ${ohmsText(rated.ohms)}, the nearest rated load at or above ${ohmsText(perChannel)} (not interpolated).`
	};
}

export interface LoadOption extends WiringOption {
	/** Against the chosen amplifier, when one was given. */
	check?: AmpLoadCheck;
}

/** Every wiring, each checked against the amplifier when there is one. */
export function loadPlan(drivers: readonly DriverGroup[], opts: { bridged?: boolean } = {}, amp: AmpLoadFigures | null = null): LoadOption[] {
	return wiringOptions(drivers, opts).map((o) => (amp ? { ...o, check: ampLoadCheck(amp, o.ohms, opts.bridged ?? false) } : o));
}
