// Steering-wheel control ladders: each button switches a resistance onto the control line and
// the head-unit input reads it. A line with no button pressed is taken to read open circuit,
// so lines sharing one input read each pressed button on its own.

export type ESeries = 'E12' | 'E24';

export interface Button {
	name: string;
	ohms: number;
}

export interface ControlLine {
	name: string;
	buttons: Button[];
}

export interface Reading {
	line: string;
	button: string;
	ohms: number;
}

export interface Gap {
	/** Higher reading over lower one (≥ 1); its log is the distance on the input's scale. */
	ratio: number;
	low: Reading;
	high: Reading;
}

export interface LadderReport {
	readings: Reading[];
	smallestGap: Gap | null;
	collides: boolean;
	collisions: [Reading, Reading][];
}

function checkOhms(ohms: number, what: string): void {
	if (!(ohms >= 0) || !Number.isFinite(ohms)) {
		throw new RangeError(`${what} must be a resistance of 0 Ω or more; got ${ohms}.`);
	}
}

export function series(rs: readonly number[]): number {
	rs.forEach((r) => checkOhms(r, 'Resistor'));
	return rs.reduce((sum, r) => sum + r, 0);
}

/** 1/R = Σ 1/Rᵢ; a 0 Ω branch shorts the whole group. */
export function parallel(rs: readonly number[]): number {
	if (rs.length === 0) throw new RangeError('Give at least one resistor.');
	rs.forEach((r) => checkOhms(r, 'Resistor'));
	if (rs.some((r) => r === 0)) return 0;
	return 1 / rs.reduce((sum, r) => sum + 1 / r, 0);
}

// IEC 60063 E24 significant figures (×10). E12 is every second E24 value.
const E24_FIGURES = [10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91];
const FIGURES: Record<ESeries, readonly number[]> = {
	E24: E24_FIGURES,
	E12: E24_FIGURES.filter((_, i) => i % 2 === 0)
};

/** One decade of the series: decade 0 is 1.0 … 9.1 Ω, decade 3 is 1.0 k … 9.1 kΩ. */
export function eDecade(name: ESeries, decade: number): number[] {
	if (!Number.isInteger(decade)) throw new RangeError('Decade must be a whole number.');
	// Integer arithmetic first keeps 4.7 kΩ exactly 4700.
	return FIGURES[name].map((f) => (decade >= 1 ? f * 10 ** (decade - 1) : f / 10 ** (1 - decade)));
}

/** Standard values from 1 Ω up to and including the top decade (default up to 9.1 MΩ). */
export function eValues(name: ESeries, fromDecade = 0, toDecade = 6): number[] {
	const values: number[] = [];
	for (let d = fromDecade; d <= toDecade; d++) values.push(...eDecade(name, d));
	return values;
}

/** Nearest standard value on a log scale, as the series itself is geometric. */
export function nearestE(value: number, name: ESeries): number {
	if (!(value > 0) || !Number.isFinite(value)) throw new RangeError('Resistance must be more than 0 Ω.');
	const decade = Math.floor(Math.log10(value));
	const candidates = [...eDecade(name, decade - 1), ...eDecade(name, decade), ...eDecade(name, decade + 1)];
	let best = candidates[0];
	for (const c of candidates) {
		if (Math.abs(Math.log(c / value)) < Math.abs(Math.log(best / value))) best = c;
	}
	return best;
}

/** Bands overlap when low × (1 + t) reaches high × (1 − t). */
function collide(low: number, high: number, t: number): boolean {
	return low * (1 + t) >= high * (1 - t);
}

function checkTolerance(tolerancePct: number): number {
	if (!(tolerancePct >= 0 && tolerancePct < 100)) {
		throw new RangeError('Tolerance must be a percentage from 0 up to (not including) 100.');
	}
	return tolerancePct / 100;
}

/** Every reading the shared input sees, the closest pair, and pairs whose tolerance bands overlap. */
export function ladderReport(lines: readonly ControlLine[], tolerancePct: number): LadderReport {
	const t = checkTolerance(tolerancePct);
	const readings: Reading[] = lines
		.flatMap((line) =>
			line.buttons.map((b) => {
				checkOhms(b.ohms, `Button "${b.name}" on ${line.name}`);
				return { line: line.name, button: b.name, ohms: b.ohms };
			})
		)
		.sort((a, b) => a.ohms - b.ohms);

	let smallestGap: Gap | null = null;
	const collisions: [Reading, Reading][] = [];
	for (let i = 0; i + 1 < readings.length; i++) {
		const low = readings[i];
		const high = readings[i + 1];
		const ratio = low.ohms === high.ohms ? 1 : high.ohms / low.ohms;
		if (!smallestGap || ratio < smallestGap.ratio) smallestGap = { ratio, low, high };
		for (let j = i + 1; j < readings.length && collide(low.ohms, readings[j].ohms, t); j++) {
			collisions.push([low, readings[j]]);
		}
	}
	return { readings, smallestGap, collides: collisions.length > 0, collisions };
}

export type SeparatorResult =
	| { ok: true; resistorOhms: number; onLine: string | null; report: LadderReport }
	| { ok: false; reason: string };

/**
 * Two lines on one input: a resistor in series with every button of one line shifts that
 * line's readings up. Readings do not move apart monotonically as the resistor grows, so each
 * standard value is tried in ascending order, on either line, and the smallest value that
 * leaves no overlapping bands wins (ties go to the second line).
 */
export function suggestSeparator(
	lineA: ControlLine,
	lineB: ControlLine,
	tolerancePct: number,
	name: ESeries
): SeparatorResult {
	const direct = ladderReport([lineA, lineB], tolerancePct);
	if (!direct.collides) return { ok: true, resistorOhms: 0, onLine: null, report: direct };
	for (const line of [lineA, lineB]) {
		const own = ladderReport([line], tolerancePct);
		if (own.collides) {
			const [a, b] = own.collisions[0];
			return {
				ok: false,
				reason: `On ${line.name}, "${a.button}" and "${b.button}" already read too close together; no series resistor can separate them.`
			};
		}
	}
	const shifted = (line: ControlLine, r: number): ControlLine => ({
		name: line.name,
		buttons: line.buttons.map((b) => ({ name: b.name, ohms: b.ohms + r }))
	});
	for (const r of eValues(name)) {
		for (const [fixed, moved] of [
			[lineA, lineB],
			[lineB, lineA]
		] as const) {
			const report = ladderReport([fixed, shifted(moved, r)], tolerancePct);
			if (!report.collides) return { ok: true, resistorOhms: r, onLine: moved.name, report };
		}
	}
	return {
		ok: false,
		reason: `No single ${name} resistor up to 9.1 MΩ separates ${lineA.name} and ${lineB.name} at ±${tolerancePct} %.`
	};
}
