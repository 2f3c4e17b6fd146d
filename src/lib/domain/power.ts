import { checkFigures, nullable, number, object, oneOf, orDefault, whole } from './figureRules';
import { awgWire, CABLE_MATERIALS, conductivityShare, DEFAULT_MATERIAL, formatAwg, gaugeLabel, materialBasis, STOCKED_POWER_GAUGES, type CableMaterial } from './wire';
import { ampacityBasis, mainFuse, wireAmpacityA } from './fuse';
import { mToFt } from './units';

export type AmpClass = 'AB' | 'D';

// Typical share of battery power that leaves as audio power (common practice).
export const AMP_CLASS_EFFICIENCY: Readonly<Record<AmpClass, number>> = { AB: 0.55, D: 0.8 };

// The basis every figure is worked on: 12.0 V nominal, the voltage ABYC E-11's drop tables are
// defined at. A lower voltage gives more current for the same power, so it is the safe side.
export const NOMINAL_VOLTS = 12;
// Voltage with the engine running and the alternator charging (common practice); shown beside.
export const CHARGING_VOLTS = 14.4;

// ABYC E-11 allows 3 % drop on critical circuits and 10 % on others; 3 % is the default target.
export const ABYC_E11_CRITICAL_DROP_PCT = 3;
export const ABYC_E11_GENERAL_DROP_PCT = 10;

// ABYC E-11's constant for copper in its conductor formula, Ω·cmil/ft.
export const ABYC_COPPER_K = 10.75;
// Conductor temperature the Ohm's-law check uses unless one is stated (IEC 60028 reference, 20 °C).
export const DEFAULT_CONDUCTOR_TEMP_C = 20;

// ABYC E-11's minimum circular-mil areas per gauge (the SAE conductor minimums; figures from
// memory, and every published 3 % table cell in the tests agrees with them).
export const ABYC_MIN_CIRCULAR_MILS: Readonly<Record<number, number>> = {
	[-3]: 205_500,
	[-2]: 158_600,
	[-1]: 125_100,
	0: 98_980,
	1: 77_790,
	2: 62_450,
	4: 37_360,
	6: 24_538,
	8: 14_810,
	10: 9_343,
	12: 5_833,
	14: 3_702,
	16: 2_336,
	18: 1_537
};

/**
 * ABYC E-11: CM = K × I × L / E, with L the round trip in feet and E the allowed drop in volts. K is
 * the copper constant; for another material it is divided by the material's share of copper's conductivity.
 */
export function abycCircularMils(currentA: number, roundTripFt: number, dropV: number, material: CableMaterial = DEFAULT_MATERIAL): number {
	if (!(currentA >= 0) || !(roundTripFt >= 0) || !(dropV > 0)) throw new RangeError('Current, length and allowed drop must be positive numbers.');
	return ((ABYC_COPPER_K / conductivityShare(material)) * currentA * roundTripFt) / dropV;
}

/** The basis a wire or current figure was worked on, in words for the page beside the answer. */
export function electricalBasis(volts: number, extra: { maxDropPct?: number; tempC?: number; material?: CableMaterial } = {}): string {
	const parts = [`${volts} V ${volts === NOMINAL_VOLTS ? 'nominal (the ABYC E-11 basis)' : 'as stated'}`];
	if (volts !== CHARGING_VOLTS) parts.push(`about ${CHARGING_VOLTS} V with the engine running`);
	const k = extra.material === 'cca' ? `${(ABYC_COPPER_K / conductivityShare('cca')).toFixed(2)} (copper's 10.75 ÷ ${conductivityShare('cca')})` : '10.75';
	if (extra.maxDropPct !== undefined) parts.push(`${extra.maxDropPct} % allowed drop, ABYC E-11 conductor formula CM = ${k} × I × L ÷ E (L the round trip in feet)`);
	if (extra.material !== undefined) parts.push(`cable: ${materialBasis(extra.material)}; ${ampacityBasis(extra.material)}`);
	if (extra.tempC !== undefined) parts.push(`resistance at ${extra.tempC} °C conductor temperature (IEC 60028${extra.material === 'cca' ? ', IEC 60889 for the aluminium core' : ''})`);
	return parts.join('; ');
}

export const CABLE_MATERIAL_WORDS = 'Cable material is copper or cca (copper-clad aluminium).';
/** A cable material, copper unless another is named. */
export const CABLE_MATERIAL = orDefault(oneOf(CABLE_MATERIALS, CABLE_MATERIAL_WORDS), DEFAULT_MATERIAL);

// Every figure has a ceiling well past any car, so nothing downstream meets an infinite or absurd value.
const positive = (label: string, unit: string, max: number) =>
	number(
		`${label} must be a number of ${unit}.`,
		[(n) => n > 0, `${label} must be more than 0 ${unit}.`],
		[(n) => n <= max, `${label} over ${max.toLocaleString('en')} ${unit} looks like a typo.`]
	);

/** The conductor temperature resistance is worked at, °C. */
export const CONDUCTOR_TEMP = orDefault(
	number(
		'Cable temperature must be a number of °C.',
		[(n) => n >= -40, 'Cable temperature below −40 °C is out of range.'],
		[(n) => n <= 150, 'Cable temperature above 150 °C is out of range.']
	),
	DEFAULT_CONDUCTOR_TEMP_C
);

export const AMP_CURRENT_INPUT = object({
	rmsWattsPerChannel: positive('RMS power per channel', 'W', 10_000),
	channels: number(
		'Channel count must be a number.',
		...whole('Channel count must be a whole number.'),
		[(n) => n >= 1, 'An amplifier has at least 1 channel.'],
		[(n) => n <= 16, 'More than 16 channels looks like a typo.']
	),
	efficiency: number('Efficiency must be a number between 0 and 1.', [(n) => n > 0, 'Efficiency must be more than 0.'], [(n) => n <= 1, 'Efficiency cannot be more than 1 (100 %).']),
	volts: orDefault(positive('Supply voltage', 'V', 60), NOMINAL_VOLTS)
});
export interface AmpCurrentInput {
	rmsWattsPerChannel: number;
	channels: number;
	efficiency: number;
	volts?: number;
}

export const POWER_WIRE_INPUT = object({
	currentA: positive('Current', 'A', 2000),
	powerLengthM: positive('Power run length', 'm', 100),
	groundLengthM: number(
		'Ground lead length must be a number of m.',
		[(n) => n >= 0, 'Ground lead length cannot be negative.'],
		[(n) => n <= 100, 'Ground lead length over 100 m looks like a typo.']
	),
	volts: orDefault(positive('Supply voltage', 'V', 60), NOMINAL_VOLTS),
	/** The amplifiers' own fuse ratings added up; the fuse must be at least this. */
	ownFuseA: orDefault(nullable(positive("Amplifiers' own fuse rating", 'A', 2000)), null),
	maxDropPct: orDefault(positive('Allowed voltage drop', '%', 100), ABYC_E11_CRITICAL_DROP_PCT),
	tempC: CONDUCTOR_TEMP,
	material: CABLE_MATERIAL
});
export interface PowerWireInput {
	currentA: number;
	powerLengthM: number;
	groundLengthM: number;
	volts?: number;
	ownFuseA?: number | null;
	maxDropPct?: number;
	tempC?: number;
	material?: CableMaterial;
}


/** Battery current: I = P_out / (efficiency × V), with P_out the total RMS output; the running-voltage figure beside. */
export function ampCurrent(input: AmpCurrentInput): { currentA: number; volts: number; runningCurrentA: number; basis: string } {
	const { rmsWattsPerChannel, channels, efficiency, volts } = checkFigures(AMP_CURRENT_INPUT, input);
	const at = (v: number) => (rmsWattsPerChannel * channels) / (efficiency * v);
	return { currentA: at(volts), volts, runningCurrentA: at(CHARGING_VOLTS), basis: electricalBasis(volts) };
}

/** Ohm's law over the loop (power run plus ground path): V = I × R. */
export function voltageDrop(
	currentA: number,
	loopLengthM: number,
	awg: number,
	tempC = 20,
	material: CableMaterial = DEFAULT_MATERIAL
): { resistanceOhms: number; dropV: number } {
	if (!(currentA >= 0)) throw new RangeError('Current must be a number of amps, 0 or more.');
	if (!(loopLengthM >= 0)) throw new RangeError('Loop length must be a number of metres, 0 or more.');
	const resistanceOhms = (awgWire(awg, tempC, material).ohmsPerKm * loopLengthM) / 1000;
	return { resistanceOhms, dropV: currentA * resistanceOhms };
}

export interface WireCandidate {
	awg: string;
	gauge: number;
	/** "4 AWG (21.2 mm²)". */
	label: string;
	resistanceOhms: number;
	dropV: number;
	dropPct: number;
	/** ABYC E-11's minimum area for the gauge against what its formula asks for, circular mils. */
	circularMils: number;
	meetsAbyc: boolean;
	ampacityA: number;
	/** Both the ABYC E-11 formula and Ohm's law at the stated temperature keep within the target. */
	meetsDrop: boolean;
	carriesCurrent: boolean;
	fuseA: number | null;
}

export interface WireBasis {
	volts: number;
	maxDropPct: number;
	tempC: number;
	roundTripFt: number;
	/** What ABYC E-11's formula asks for, circular mils. */
	requiredCircularMils: number;
	ownFuseA: number | null;
	material: CableMaterial;
	text: string;
}

export type PowerWireResult =
	| {
			ok: true;
			awg: string;
			gauge: number;
			label: string;
			material: CableMaterial;
			resistanceOhms: number;
			dropV: number;
			dropPct: number;
			ampacityA: number;
			fuseA: number;
			fuseBasis: string;
			/** Set when the drop alone allowed a thinner cable that could not carry the fuse. */
			upsized: { fromAwg: string; reason: string } | null;
			basis: WireBasis;
			candidates: WireCandidate[];
	  }
	| { ok: false; reason: string; basis: WireBasis; candidates: WireCandidate[] };

/**
 * Thinnest stocked gauge that keeps the drop within the target on both ABYC E-11's formula and
 * Ohm's law at the stated conductor temperature, and that can carry the fuse its load needs.
 * Candidates are listed thinnest first.
 */
export function powerWire(input: PowerWireInput): PowerWireResult {
	const { currentA, powerLengthM, groundLengthM, volts, maxDropPct, tempC, ownFuseA, material } = checkFigures(POWER_WIRE_INPUT, input);
	const loopM = powerLengthM + groundLengthM;
	const roundTripFt = mToFt(loopM);
	const requiredCircularMils = abycCircularMils(currentA, roundTripFt, (volts * maxDropPct) / 100, material);
	const basis: WireBasis = {
		volts,
		maxDropPct,
		tempC,
		roundTripFt,
		requiredCircularMils,
		ownFuseA,
		material,
		text: electricalBasis(volts, { maxDropPct, tempC, material })
	};
	const candidates = [...STOCKED_POWER_GAUGES]
		.sort((a, b) => b - a)
		.map((gauge): WireCandidate => {
			const { resistanceOhms, dropV } = voltageDrop(currentA, loopM, gauge, tempC, material);
			const dropPct = (dropV / volts) * 100;
			const circularMils = ABYC_MIN_CIRCULAR_MILS[gauge];
			const meetsAbyc = circularMils >= requiredCircularMils;
			const ampacityA = wireAmpacityA(gauge, material);
			const fuse = mainFuse(currentA, gauge, ownFuseA, material);
			return {
				awg: formatAwg(gauge),
				gauge,
				label: gaugeLabel(gauge),
				resistanceOhms,
				dropV,
				dropPct,
				circularMils,
				meetsAbyc,
				ampacityA,
				meetsDrop: meetsAbyc && dropPct <= maxDropPct,
				carriesCurrent: currentA <= ampacityA,
				fuseA: fuse.ok ? fuse.fuseA : null
			};
		});

	const chosen = candidates.find((c) => c.meetsDrop && c.carriesCurrent && c.fuseA !== null);
	const byDrop = candidates.find((c) => c.meetsDrop);
	if (chosen && chosen.fuseA !== null) {
		const { awg, gauge, label, resistanceOhms, dropV, dropPct, ampacityA, fuseA } = chosen;
		const upsized =
			byDrop && byDrop.gauge !== gauge
				? {
						fromAwg: byDrop.awg,
						reason: `${byDrop.label} keeps the drop within ${maxDropPct} %, but the ${fuseA} A fuse the load needs is more than it can carry (${byDrop.ampacityA} A), so the cable is ${label}.`
					}
				: null;
		const fuse = mainFuse(currentA, gauge, ownFuseA, material);
		const fuseBasis = fuse.ok ? fuse.basis : '';
		return { ok: true, awg, gauge, label, material, resistanceOhms, dropV, dropPct, ampacityA, fuseA, fuseBasis, upsized, basis, candidates };
	}
	const heaviest = candidates[candidates.length - 1];
	const heaviestFuse = mainFuse(currentA, heaviest.gauge, ownFuseA, material);
	const reason = !heaviest.carriesCurrent
		? `${round1(currentA)} A is more than the heaviest stocked cable (${heaviest.label}${material === 'cca' ? ' CCA' : ''}, ${heaviest.ampacityA} A) can carry; split the load over separate runs.`
		: !heaviest.meetsDrop
			? `Even ${heaviest.label} drops more than the ${maxDropPct} % target over a ${round1(loopM)} m loop (${round1(heaviest.dropPct)} % at ${tempC} °C; ABYC E-11 asks for ${Math.round(requiredCircularMils).toLocaleString('en')} circular mils); shorten the run or use heavier cable.`
			: heaviestFuse.ok
				? `No stocked cable pairs with a standard fuse for ${round1(currentA)} A; use a heavier cable.`
				: heaviestFuse.reason;
	return { ok: false, reason, basis, candidates };
}

const round1 = (x: number): number => Math.round(x * 10) / 10;
