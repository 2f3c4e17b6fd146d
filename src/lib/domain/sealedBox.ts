import { checkFigures, number, object, refine } from './figureRules';
import { litresToCubicFeet } from './boxVolume';

// A sealed box from a driver's Thiele/Small figures (R. H. Small, "Closed-Box Loudspeaker Systems",
// Parts I and II, J. Audio Eng. Soc. 20 and 21, 1972–73). The air in the box stiffens the driver's
// suspension by α = Vas / Vb, which raises resonance and Q alike: fc = Fs √(α + 1), Qtc = Qts √(α + 1).

/** Qtc 0.707: the maximally flat (Butterworth) second-order alignment. */
export const BUTTERWORTH_QTC = Math.SQRT1_2;

const figure = (typeMessage: string, above: string, min: readonly [number, string], max: readonly [number, string]) =>
	number(typeMessage, [(n) => n > 0, above], [(n) => n >= min[0], min[1]], [(n) => n <= max[0], max[1]]);

export const SEALED_INPUT = refine(
	object({
		fsHz: figure('Fs must be a number of hertz.', 'Fs must be more than 0 Hz.', [5, 'Fs under 5 Hz looks like a typo.'], [500, 'Fs over 500 Hz looks like a typo for a woofer.']),
		qts: figure('Qts must be a number.', 'Qts must be more than 0.', [0.05, 'Qts under 0.05 looks like a typo.'], [3, 'Qts over 3 looks like a typo.']),
		vasL: figure('Vas must be a number of litres.', 'Vas must be more than 0 L.', [0.1, 'Vas under 0.1 L looks like a typo.'], [2000, 'Vas over 2000 L looks like a typo.']),
		qtc: figure('Qtc must be a number.', 'Qtc must be more than 0.', [0.3, 'Qtc under 0.3 is not a useful sealed box.'], [3, 'Qtc over 3 looks like a typo.'])
	}),
	(v, refuse) => {
		if (!(v.qtc > v.qts)) refuse(['qtc'], "Qtc must be higher than the driver's Qts: a sealed box only ever raises Q.");
	}
);
export interface SealedInput {
	fsHz: number;
	qts: number;
	vasL: number;
	qtc: number;
}

export interface SealedBox {
	volumeL: number;
	volumeCubicFeet: number;
	/** Resonance in the box, Hz. */
	fcHz: number;
	/** Where the response is 3 dB down, Hz. */
	f3Hz: number;
	/** Vas / Vb, the compliance ratio. */
	alpha: number;
}

/**
 * Vb = Vas / ((Qtc / Qts)² − 1), fc = Fs × Qtc / Qts, and the −3 dB point of the second-order
 * high-pass: f3 = fc × √((1/Qtc² − 2 + √((1/Qtc² − 2)² + 4)) / 2) (Small, Part I).
 */
export function sealedBox(input: SealedInput): SealedBox {
	const { fsHz, qts, vasL, qtc } = checkFigures(SEALED_INPUT, input);
	const ratio = qtc / qts;
	const alpha = ratio ** 2 - 1;
	const volumeL = vasL / alpha;
	const fcHz = fsHz * ratio;
	const k = 1 / qtc ** 2 - 2;
	const f3Hz = fcHz * Math.sqrt((k + Math.sqrt(k ** 2 + 4)) / 2);
	return { volumeL, volumeCubicFeet: litresToCubicFeet(volumeL), fcHz, f3Hz, alpha };
}
