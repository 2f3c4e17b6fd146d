// Copper wire by American Wire Gauge. Gauges are numbers: 0 is 1/0, -1 is 2/0, -2 is 3/0, -3 is 4/0.

export const MIN_AWG = -3;
export const MAX_AWG = 40;

// Annealed copper at 20 °C, IEC 60028: 1/58 Ω·mm²/m (≈ 0.017241).
export const COPPER_RESISTIVITY_OHM_MM2_PER_M = 1 / 58;
// IEC 60028 temperature coefficient at 20 °C: R_t = R_20 · (1 + 0.00393 · (t − 20)).
export const COPPER_TEMP_COEFF_PER_C = 0.00393;

// Gauges a shop keeps on the reel for amplifier power and ground runs (common practice).
export const STOCKED_POWER_GAUGES: readonly number[] = [0, 2, 4, 6, 8, 10, 12, 14, 16, 18];

export interface AwgWire {
	awg: string;
	diameterMm: number;
	areaMm2: number;
	ohmsPerKm: number;
}

function assertGauge(n: number): void {
	if (!Number.isInteger(n) || n < MIN_AWG || n > MAX_AWG) {
		throw new RangeError(`Wire gauge must be a whole AWG size from 4/0 to 40; got ${n}.`);
	}
}

/** ASTM B258: d = 0.127 mm × 92^((36 − n) / 39). */
export function awgDiameterMm(n: number): number {
	assertGauge(n);
	return 0.127 * 92 ** ((36 - n) / 39);
}

export function awgAreaMm2(n: number): number {
	const d = awgDiameterMm(n);
	return (Math.PI / 4) * d * d;
}

/** R = ρ / A per metre, corrected linearly for conductor temperature (IEC 60028). */
export function copperOhmsPerKm(areaMm2: number, tempC = 20): number {
	if (!(areaMm2 > 0)) throw new RangeError('Conductor area must be more than 0 mm².');
	if (!Number.isFinite(tempC)) throw new RangeError('Conductor temperature must be a number of °C.');
	const r20 = (COPPER_RESISTIVITY_OHM_MM2_PER_M / areaMm2) * 1000;
	return r20 * (1 + COPPER_TEMP_COEFF_PER_C * (tempC - 20));
}

/** Reads "4", "4 AWG", "1/0", "0", "00", "4/0", "0000"; throws RangeError with a readable message. */
export function parseAwg(input: string): number {
	const text = input.trim().toLowerCase().replace(/\s*(awg|ga|gauge)$/, '');
	let n: number;
	const aught = /^([1-4])\/0$/.exec(text);
	if (aught) n = 1 - Number(aught[1]);
	else if (/^0{1,4}$/.test(text)) n = 1 - text.length;
	else if (/^\d{1,2}$/.test(text)) n = Number(text);
	else throw new RangeError(`"${input.trim()}" is not a wire gauge; write e.g. 4, 10 AWG, 1/0 or 2/0.`);
	assertGauge(n);
	return n;
}

export function formatAwg(n: number): string {
	assertGauge(n);
	return n <= 0 ? `${1 - n}/0` : String(n);
}

export function awgWire(n: number, tempC = 20): AwgWire {
	const diameterMm = awgDiameterMm(n);
	const areaMm2 = (Math.PI / 4) * diameterMm * diameterMm;
	return { awg: formatAwg(n), diameterMm, areaMm2, ohmsPerKm: copperOhmsPerKm(areaMm2, tempC) };
}
