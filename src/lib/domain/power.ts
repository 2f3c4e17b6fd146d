import { z } from 'zod';
import { parseInput } from './validate';
import { awgWire, formatAwg, STOCKED_POWER_GAUGES } from './wire';
import { mainFuse, wireAmpacityA } from './fuse';

export type AmpClass = 'AB' | 'D';

// Typical share of battery power that leaves as audio power (common practice).
export const AMP_CLASS_EFFICIENCY: Readonly<Record<AmpClass, number>> = { AB: 0.55, D: 0.8 };

// Voltage with the engine running and the alternator charging (common practice).
export const CHARGING_VOLTS = 14.4;

// ABYC E-11 allows 3 % drop on critical circuits; used here as the default target.
export const ABYC_E11_CRITICAL_DROP_PCT = 3;

const positive = (label: string, unit: string) =>
	z
		.number({ error: `${label} must be a number of ${unit}.` })
		.positive(`${label} must be more than 0 ${unit}.`);

export const ampCurrentInputSchema = z.object({
	rmsWattsPerChannel: positive('RMS power per channel', 'W'),
	channels: z
		.number({ error: 'Channel count must be a number.' })
		.int('Channel count must be a whole number.')
		.min(1, 'An amplifier has at least 1 channel.'),
	efficiency: z
		.number({ error: 'Efficiency must be a number between 0 and 1.' })
		.gt(0, 'Efficiency must be more than 0.')
		.max(1, 'Efficiency cannot be more than 1 (100 %).'),
	volts: positive('Supply voltage', 'V')
});
export type AmpCurrentInput = z.input<typeof ampCurrentInputSchema>;

export const powerWireInputSchema = z.object({
	currentA: positive('Current', 'A'),
	powerLengthM: positive('Power run length', 'm'),
	groundLengthM: z
		.number({ error: 'Ground lead length must be a number of m.' })
		.min(0, 'Ground lead length cannot be negative.'),
	volts: positive('Supply voltage', 'V'),
	maxDropPct: positive('Allowed voltage drop', '%')
		.max(100, 'Allowed voltage drop cannot be more than 100 %.')
		.default(ABYC_E11_CRITICAL_DROP_PCT),
	tempC: z
		.number({ error: 'Cable temperature must be a number of °C.' })
		.min(-40, 'Cable temperature below −40 °C is out of range.')
		.max(150, 'Cable temperature above 150 °C is out of range.')
		.default(20)
});
export type PowerWireInput = z.input<typeof powerWireInputSchema>;


/** Battery current: I = P_out / (efficiency × V), with P_out the total RMS output. */
export function ampCurrent(input: AmpCurrentInput): { currentA: number } {
	const { rmsWattsPerChannel, channels, efficiency, volts } = parseInput(ampCurrentInputSchema, input);
	return { currentA: (rmsWattsPerChannel * channels) / (efficiency * volts) };
}

/** Ohm's law over the loop (power run plus ground path): V = I × R. */
export function voltageDrop(
	currentA: number,
	loopLengthM: number,
	awg: number,
	tempC = 20
): { resistanceOhms: number; dropV: number } {
	if (!(currentA >= 0)) throw new RangeError('Current must be a number of amps, 0 or more.');
	if (!(loopLengthM >= 0)) throw new RangeError('Loop length must be a number of metres, 0 or more.');
	const resistanceOhms = (awgWire(awg, tempC).ohmsPerKm * loopLengthM) / 1000;
	return { resistanceOhms, dropV: currentA * resistanceOhms };
}

export interface WireCandidate {
	awg: string;
	gauge: number;
	resistanceOhms: number;
	dropV: number;
	dropPct: number;
	ampacityA: number;
	meetsDrop: boolean;
	carriesCurrent: boolean;
	fuseA: number | null;
}

export type PowerWireResult =
	| {
			ok: true;
			awg: string;
			gauge: number;
			resistanceOhms: number;
			dropV: number;
			dropPct: number;
			ampacityA: number;
			fuseA: number;
			candidates: WireCandidate[];
	  }
	| { ok: false; reason: string; candidates: WireCandidate[] };

/**
 * Thinnest stocked gauge whose drop stays within the target and which a standard fuse can
 * protect while covering the draw. Candidates are listed thinnest first.
 */
export function powerWire(input: PowerWireInput): PowerWireResult {
	const { currentA, powerLengthM, groundLengthM, volts, maxDropPct, tempC } = parseInput(
		powerWireInputSchema,
		input
	);
	const loopM = powerLengthM + groundLengthM;
	const candidates = [...STOCKED_POWER_GAUGES]
		.sort((a, b) => b - a)
		.map((gauge): WireCandidate => {
			const { resistanceOhms, dropV } = voltageDrop(currentA, loopM, gauge, tempC);
			const dropPct = (dropV / volts) * 100;
			const ampacityA = wireAmpacityA(gauge);
			const fuse = mainFuse(currentA, gauge);
			return {
				awg: formatAwg(gauge),
				gauge,
				resistanceOhms,
				dropV,
				dropPct,
				ampacityA,
				meetsDrop: dropPct <= maxDropPct,
				carriesCurrent: currentA <= ampacityA,
				fuseA: fuse.ok ? fuse.fuseA : null
			};
		});

	const chosen = candidates.find((c) => c.meetsDrop && c.carriesCurrent && c.fuseA !== null);
	if (chosen && chosen.fuseA !== null) {
		const { awg, gauge, resistanceOhms, dropV, dropPct, ampacityA, fuseA } = chosen;
		return { ok: true, awg, gauge, resistanceOhms, dropV, dropPct, ampacityA, fuseA, candidates };
	}
	const heaviest = candidates[candidates.length - 1];
	const reason = !heaviest.carriesCurrent
		? `${round1(currentA)} A is more than the heaviest stocked cable (${heaviest.awg} AWG, ${heaviest.ampacityA} A) can carry; split the load over separate runs.`
		: !heaviest.meetsDrop
			? `Even ${heaviest.awg} AWG drops ${round1(heaviest.dropPct)} % over a ${round1(loopM)} m loop, above the ${maxDropPct} % target; shorten the run or use heavier cable.`
			: `No stocked cable pairs with a standard fuse for ${round1(currentA)} A; use a heavier cable.`;
	return { ok: false, reason, candidates };
}

const round1 = (x: number): number => Math.round(x * 10) / 10;
