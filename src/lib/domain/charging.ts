import { checkFigures, nullable, number, object, orDefault, refine, type NumberCheck } from './figureRules';
import { ABYC_E11_CRITICAL_DROP_PCT, CABLE_MATERIAL, NOMINAL_VOLTS, powerWire } from './power';
import { materialBasis, type CableMaterial } from './wire';

// The charging budget: does the alternator keep up with the vehicle's own load plus what the install
// adds, at cruise and at idle; and the gauge of the three main charging cables when they should be
// upgraded, from the same wire rules as every power run (power.ts).

// A fully charged lead-acid battery at rest, and the usual charging voltage with the engine running
// (common practice).
export const RESTING_VOLTS = 12.6;
export const RUNNING_VOLTS_MIN = 13.8;
export const RUNNING_VOLTS_MAX = 14.4;

// Less than a tenth of the alternator's output spare leaves nothing for heat, age and the fan on full
// (common practice).
export const TIGHT_HEADROOM_SHARE = 0.1;

// The charging cables are worth upgrading once the install adds a fifth of the alternator's output or
// more (common practice).
export const UPGRADE_SHARE = 0.2;

export const CHARGING_RUNS = ['alternator-battery', 'battery-body', 'engine-body'] as const;
export type ChargingRun = (typeof CHARGING_RUNS)[number];
export const CHARGING_RUN_NAMES: Readonly<Record<ChargingRun, string>> = {
	'alternator-battery': 'Alternator positive to battery positive',
	'battery-body': 'Battery negative to the body',
	'engine-body': 'Engine block to the body'
};
// Typical lengths in a front-engined car (common practice); the form and the API may give their own.
export const DEFAULT_RUN_LENGTHS_M: Readonly<Record<ChargingRun, number>> = { 'alternator-battery': 1.5, 'battery-body': 0.5, 'engine-body': 0.75 };

export const CHARGING_CAUTIONS: readonly string[] = [
	'Disconnect the battery negative terminal first and reconnect it last.',
	'Wear eye protection at the battery and keep sparks and flames away: a charging battery gives off hydrogen.',
	"Follow the vehicle maker's procedure for disconnecting the battery: some vehicles need a memory saver or a battery-monitor reset afterwards.",
	'Where the maker fuses the alternator cable, fit a fuse rated for the new cable in the same place.',
	'The gauges assume free air; a cable in a hot engine bay carries less, so go one size heavier there (common practice).'
];

const ampChecks = (label: string, max = 500): NumberCheck[] => [
	[(n) => n >= 0, `${label} cannot be negative.`],
	[(n) => n <= max, `${label} over ${max} A looks like a typo.`]
];
const amps = (label: string, max = 500) => number(`${label} must be a number of amps.`, ...ampChecks(label, max));

const runLength = (label: string, fallback: number) =>
	orDefault(
		number(`${label} must be a number of metres.`, [(n) => n > 0, `${label} must be more than 0 m.`], [(n) => n <= 10, `${label} over 10 m looks like a typo.`]),
		fallback
	);

export const CHARGING_INPUT = refine(
	object({
		alternatorA: number(
			"The alternator's output at cruise must be a number of amps.",
			...ampChecks("The alternator's output at cruise"),
			[(n) => n > 0, "The alternator's output at cruise must be more than 0 A."]
		),
		alternatorIdleA: orDefault(nullable(amps("The alternator's output at idle")), null),
		vehicleLoadA: amps("The vehicle's own load"),
		addedLoadA: amps('The added load', 1000),
		runLengthsM: orDefault(
			object({
				'alternator-battery': runLength('Alternator to battery length', DEFAULT_RUN_LENGTHS_M['alternator-battery']),
				'battery-body': runLength('Battery to body length', DEFAULT_RUN_LENGTHS_M['battery-body']),
				'engine-body': runLength('Engine to body length', DEFAULT_RUN_LENGTHS_M['engine-body'])
			}),
			{ ...DEFAULT_RUN_LENGTHS_M }
		),
		material: CABLE_MATERIAL
	}),
	(v, refuse) => {
		if (v.alternatorIdleA !== null && v.alternatorIdleA > v.alternatorA) refuse(['alternatorIdleA'], "The alternator's output at idle cannot be more than at cruise.");
	}
);
export interface ChargingInput {
	alternatorA: number;
	alternatorIdleA?: number | null;
	vehicleLoadA: number;
	addedLoadA: number;
	runLengthsM?: Partial<Record<ChargingRun, number>>;
	material?: CableMaterial;
}

export type ChargingVerdict = 'keeps-up' | 'tight' | 'short-at-idle' | 'short';

export interface CableUpgrade {
	run: ChargingRun;
	name: string;
	lengthM: number;
	/** The gauge that carries the alternator's full output within the drop target; null when no stocked cable does. */
	awg: string | null;
	dropPct: number | null;
	material: CableMaterial;
	reason?: string;
}

export interface ChargingBudget {
	verdict: ChargingVerdict;
	/** The verdict in plain words. */
	words: string;
	totalA: number;
	headroomA: number;
	idleHeadroomA: number | null;
	/** Empty when the install does not call for heavier charging cables. */
	upgrade: CableUpgrade[];
	upgradeAdvice: string;
	basis: string;
}

const a1 = (x: number) => `${Math.round(x * 10) / 10} A`;

/** The gauge for one charging cable: the alternator's full output within the critical drop, on the power-wire rules. */
function chargingCable(run: ChargingRun, lengthM: number, alternatorA: number, material: CableMaterial): CableUpgrade {
	const name = CHARGING_RUN_NAMES[run];
	const sized = powerWire({ currentA: alternatorA, powerLengthM: lengthM, groundLengthM: 0, maxDropPct: ABYC_E11_CRITICAL_DROP_PCT, material });
	// A charging cable carries the whole output unfused (or behind the maker's own link), so it is sized
	// on drop and ampacity alone; the stocked gauges come thinnest first.
	const pick = sized.candidates.find((c) => c.meetsDrop && c.carriesCurrent);
	if (!pick) return { run, name, lengthM, awg: null, dropPct: null, material, reason: `No stocked cable carries ${a1(alternatorA)} within ${ABYC_E11_CRITICAL_DROP_PCT} % over ${lengthM} m; run two cables side by side.` };
	return { run, name, lengthM, awg: pick.awg, dropPct: pick.dropPct, material };
}

/**
 * Total continuous draw (the vehicle's own load plus the install's) against the alternator's output
 * at cruise and at idle. The draw is taken as entered, at full continuous output: the conservative
 * basis, since music at listening level averages far less.
 */
export function chargingBudget(input: ChargingInput): ChargingBudget {
	const { alternatorA, alternatorIdleA, vehicleLoadA, addedLoadA, runLengthsM, material } = checkFigures(CHARGING_INPUT, input);
	const totalA = vehicleLoadA + addedLoadA;
	const headroomA = alternatorA - totalA;
	const idleHeadroomA = alternatorIdleA === null ? null : alternatorIdleA - totalA;

	let verdict: ChargingVerdict;
	let words: string;
	if (headroomA < 0) {
		verdict = 'short';
		words = `The alternator falls ${a1(-headroomA)} short even at cruise: the battery drains whenever the system plays hard. Fit a higher-output alternator or lower the load.`;
	} else if (idleHeadroomA !== null && idleHeadroomA < 0) {
		verdict = 'short-at-idle';
		words = `Keeps up at cruise with ${a1(headroomA)} spare, but falls ${a1(-idleHeadroomA)} short at idle: the battery makes up the difference in traffic and at a standstill.`;
	} else if (headroomA < TIGHT_HEADROOM_SHARE * alternatorA) {
		verdict = 'tight';
		words = `Keeps up, but only ${a1(headroomA)} spare at cruise, less than a tenth of the alternator's output (common practice asks for more).`;
	} else if (idleHeadroomA !== null && alternatorIdleA !== null && idleHeadroomA < TIGHT_HEADROOM_SHARE * alternatorIdleA) {
		verdict = 'tight';
		words = `Keeps up with ${a1(headroomA)} spare at cruise, but only ${a1(idleHeadroomA)} at idle, less than a tenth of the alternator's idle output (common practice asks for more).`;
	} else {
		verdict = 'keeps-up';
		words = `Keeps up: ${a1(headroomA)} spare at cruise${idleHeadroomA === null ? '' : ` and ${a1(idleHeadroomA)} at idle`}.`;
	}

	const advised = addedLoadA >= UPGRADE_SHARE * alternatorA;
	const upgrade = advised ? CHARGING_RUNS.map((run) => chargingCable(run, runLengthsM[run], alternatorA, material)) : [];
	const upgradeAdvice = advised
		? `The install adds ${a1(addedLoadA)}, a fifth or more of the alternator's ${a1(alternatorA)} (common practice): upgrade the three charging cables so each carries the alternator's full output.`
		: `The install adds less than a fifth of the alternator's output (common practice): the maker's charging cables can stay.`;
	const basis = `Draw as entered, at full continuous output (the conservative basis). Charging cables carry the alternator's full ${a1(alternatorA)} within ${ABYC_E11_CRITICAL_DROP_PCT} % drop at ${NOMINAL_VOLTS} V (ABYC E-11 formula) and within the chassis-wiring ampacity, in ${materialBasis(material)}. A battery at rest reads about ${RESTING_VOLTS} V fully charged; with the engine running, ${RUNNING_VOLTS_MIN}–${RUNNING_VOLTS_MAX} V (common practice).`;
	return { verdict, words, totalA, headroomA, idleHeadroomA, upgrade, upgradeAdvice, basis };
}

export type VoltageReading = { state: 'good' | 'low' | 'high'; words: string };

/** A voltmeter reading at the battery, resting (engine off for a while) or running, in words (common practice). */
export function readBatteryVoltage(volts: number, running: boolean): VoltageReading {
	if (!(volts > 0) || volts > 20) throw new RangeError('A battery reading is between 0 and 20 V.');
	if (running) {
		if (volts < RUNNING_VOLTS_MIN) return { state: 'low', words: `${volts} V running is below ${RUNNING_VOLTS_MIN} V: the alternator is not keeping the battery charged. Test the charging system before adding load.` };
		if (volts > RUNNING_VOLTS_MAX + 0.4) return { state: 'high', words: `${volts} V running is above about ${RUNNING_VOLTS_MAX + 0.4} V: the battery may be overcharged. Have the regulator tested.` };
		return { state: 'good', words: `${volts} V running is within ${RUNNING_VOLTS_MIN}–${RUNNING_VOLTS_MAX} V: charging normally.` };
	}
	if (volts < RESTING_VOLTS - 0.2) return { state: 'low', words: `${volts} V at rest is low (a charged battery reads about ${RESTING_VOLTS} V): charge and test the battery before the install.` };
	if (volts > RUNNING_VOLTS_MIN) return { state: 'high', words: `${volts} V is a charging voltage, not a resting one: let the battery stand with the engine off, then measure again.` };
	return { state: 'good', words: `${volts} V at rest: the battery is charged (about ${RESTING_VOLTS} V fully charged).` };
}
