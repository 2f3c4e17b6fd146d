export interface SpeakerCableInput {
	speakers: number;
	/** Run the amplifier remote-turn-on lead in a spare core of the same cable. */
	includeRemote: boolean;
	coresPerCable: number;
}

export interface SpeakerCablePlan {
	conductors: number;
	cables: number;
	pairsPerCable: number;
	spareCores: number;
}

function wholeNumber(value: number, label: string, min: number): void {
	if (!Number.isInteger(value) || value < min) {
		throw new RangeError(`${label} must be a whole number of at least ${min}; got ${value}.`);
	}
}

/**
 * Two conductors a speaker plus one for the remote lead. A speaker's pair stays in one cable
 * (common practice: the two conductors run together), so an odd core is left spare.
 */
export function speakerCablePlan({ speakers, includeRemote, coresPerCable }: SpeakerCableInput): SpeakerCablePlan {
	wholeNumber(speakers, 'Speaker count', 0);
	wholeNumber(coresPerCable, 'Cores per cable', 2);
	const pairsPerCable = Math.floor(coresPerCable / 2);
	let cables = Math.ceil(speakers / pairsPerCable);
	if (includeRemote && cables * coresPerCable - 2 * speakers === 0) cables += 1;
	const conductors = 2 * speakers + (includeRemote ? 1 : 0);
	return { conductors, cables, pairsPerCable, spareCores: cables * coresPerCable - conductors };
}

function impedances(zs: readonly number[]): void {
	if (zs.length === 0) throw new RangeError('Give at least one speaker impedance.');
	for (const z of zs) {
		if (!(z > 0) || !Number.isFinite(z)) throw new RangeError(`Speaker impedance must be more than 0 Ω; got ${z}.`);
	}
}

/** Impedances in series add. */
export function seriesImpedance(zs: readonly number[]): number {
	impedances(zs);
	return zs.reduce((sum, z) => sum + z, 0);
}

/** Impedances in parallel: 1/Z = Σ 1/Zᵢ. */
export function parallelImpedance(zs: readonly number[]): number {
	impedances(zs);
	return 1 / zs.reduce((sum, z) => sum + 1 / z, 0);
}

/** A bank of identical speakers: `parallel` strings, each of `inSeries` speakers. */
export function seriesParallelImpedance(impedanceOhms: number, inSeries: number, parallel: number): number {
	impedances([impedanceOhms]);
	wholeNumber(inSeries, 'Speakers in series', 1);
	wholeNumber(parallel, 'Parallel strings', 1);
	return (impedanceOhms * inSeries) / parallel;
}
