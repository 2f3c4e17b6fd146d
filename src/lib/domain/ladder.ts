// Steering-wheel control ladders as a circuit: the interface pulls the control line up to its
// reference voltage through a resistor, each button switches a resistance from the line to
// ground, and an ADC reads the divider. Lines that share one input sit in parallel, so a line
// that is idle (its resistance with no button pressed) loads every reading of the others.

export type ESeries = 'E12' | 'E24';

export interface Button {
	name: string;
	ohms: number;
}

export interface ControlLine {
	name: string;
	buttons: Button[];
	/** This line's own idle resistance, Ω; otherwise the circuit's. */
	idleOhms?: number;
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

export interface LadderCircuit {
	/** The interface's pull-up resistor to the reference voltage, Ω. */
	pullUpOhms: number;
	/** ADC reference voltage (also the pull-up supply), V. */
	vrefV: number;
	/** ADC resolution, bits. */
	adcBits: number;
	/** Resistor tolerance, ±%, applied to the buttons and the pull-up. */
	tolerancePct: number;
	/** A line's resistance with no button pressed, Ω; null for an open line. */
	idleOhms: number | null;
}

// A typical steering-control interface: 5 V reference, 10-bit ADC, 4.7 kΩ pull-up, ±5 % parts
// (common practice; the interface's own data sheet wins).
export const DEFAULT_CIRCUIT: Readonly<LadderCircuit> = { pullUpOhms: 4700, vrefV: 5, adcBits: 10, tolerancePct: 5, idleOhms: null };
// Two readings closer than this many counts, tolerance included, are called a collision: the
// ADC's own error is about a count either way (common practice).
export const GUARD_COUNTS = 2;

export interface Reading {
	line: string;
	button: string;
	/** The button's own resistance, Ω (Infinity for an open idle line). */
	ohms: number;
	/** What the input sees: the button with every other line idle in parallel, Ω. */
	seenOhms: number;
	volts: number;
	counts: number;
	/** The counts the reading can take with every resistor at either end of its tolerance. */
	band: { low: number; high: number };
	idle?: true;
}

export interface Gap {
	/** Clear counts between the two bands (negative where they overlap). */
	counts: number;
	low: Reading;
	high: Reading;
}

export interface LadderReport {
	circuit: LadderCircuit;
	fullScale: number;
	readings: Reading[];
	/** The reading with no button pressed. */
	idle: Reading;
	smallestGap: Gap | null;
	collides: boolean;
	collisions: [Reading, Reading][];
}

function checkCircuit(c: LadderCircuit): LadderCircuit {
	if (!(c.pullUpOhms > 0) || !Number.isFinite(c.pullUpOhms)) throw new RangeError('The pull-up must be a resistance above 0 Ω.');
	if (!(c.vrefV > 0) || !Number.isFinite(c.vrefV)) throw new RangeError('The reference voltage must be above 0 V.');
	if (!Number.isInteger(c.adcBits) || c.adcBits < 6 || c.adcBits > 24) throw new RangeError('ADC resolution must be a whole number of bits from 6 to 24.');
	if (!(c.tolerancePct >= 0 && c.tolerancePct < 100)) throw new RangeError('Tolerance must be a percentage from 0 up to (not including) 100.');
	if (c.idleOhms !== null) checkOhms(c.idleOhms, 'The idle-line resistance');
	return c;
}

/** Divider ratio R / (R + Rp); an open line (Infinity) reads the full reference. */
const ratio = (r: number, pullUp: number): number => (r === Infinity ? 1 : r / (r + pullUp));

/**
 * A pull-up divider read by an ideal ADC: V = Vref × R / (R + Rp), counts = V / Vref × (2^N − 1)
 * (voltage divider rule; the code scale of a unipolar ADC).
 */
export function ladderReading(seenOhms: number, circuit: LadderCircuit): { volts: number; counts: number } {
	const fullScale = 2 ** circuit.adcBits - 1;
	const k = ratio(seenOhms, circuit.pullUpOhms);
	return { volts: circuit.vrefV * k, counts: k * fullScale };
}

/** Counts at the two ends of tolerance: every resistor low with the pull-up high, and the reverse. */
function band(parts: { button: number; others: number[] }, c: LadderCircuit): { low: number; high: number } {
	const t = c.tolerancePct / 100;
	const fullScale = 2 ** c.adcBits - 1;
	const seen = (f: number) => parallelOpen([parts.button * f, ...parts.others.map((o) => o * f)]);
	return { low: ratio(seen(1 - t), c.pullUpOhms * (1 + t)) * fullScale, high: ratio(seen(1 + t), c.pullUpOhms * (1 - t)) * fullScale };
}

/** Parallel resistances where an open branch (Infinity) carries nothing. */
function parallelOpen(rs: readonly number[]): number {
	const closed = rs.filter((r) => r !== Infinity);
	return closed.length === 0 ? Infinity : parallel(closed);
}

/** Every reading the shared input sees (the idle line included), the closest pair in counts, and pairs that cannot be told apart. */
export function ladderReport(lines: readonly ControlLine[], circuitIn: Partial<LadderCircuit> = {}): LadderReport {
	const circuit = checkCircuit({ ...DEFAULT_CIRCUIT, ...circuitIn });
	const idleOf = (line: ControlLine) => line.idleOhms ?? circuit.idleOhms ?? Infinity;
	const make = (line: string, button: string, ohms: number, others: number[], idle?: true): Reading => {
		const seenOhms = parallelOpen([ohms, ...others]);
		const { volts, counts } = ladderReading(seenOhms, circuit);
		return { line, button, ohms, seenOhms, volts, counts, band: band({ button: ohms, others }, circuit), ...(idle ? { idle } : {}) };
	};
	const buttons = lines.flatMap((line, i) => {
		const others = lines.filter((_, j) => j !== i).map(idleOf);
		return line.buttons.map((b) => {
			checkOhms(b.ohms, `Button "${b.name}" on ${line.name}`);
			return make(line.name, b.name, b.ohms, others);
		});
	});
	const idleAll = lines.map(idleOf);
	const idle = make('All lines', 'No button', idleAll[0] ?? Infinity, idleAll.slice(1), true);
	const readings = [...buttons, idle].sort((a, b) => a.counts - b.counts);

	let smallestGap: Gap | null = null;
	const collisions: [Reading, Reading][] = [];
	for (let i = 0; i + 1 < readings.length; i++) {
		const low = readings[i];
		const high = readings[i + 1];
		const gap = high.band.low - low.band.high;
		if (!smallestGap || gap < smallestGap.counts) smallestGap = { counts: gap, low, high };
		for (let j = i + 1; j < readings.length && readings[j].band.low - low.band.high < GUARD_COUNTS; j++) {
			collisions.push([low, readings[j]]);
		}
	}
	return { circuit, fullScale: 2 ** circuit.adcBits - 1, readings, idle, smallestGap, collides: collisions.length > 0, collisions };
}

export type SeparatorResult =
	| { ok: true; resistorOhms: number; onLine: string | null; report: LadderReport }
	| { ok: false; reason: string };

/**
 * Two lines on one input: a resistor in series with one line moves all of its readings (and its
 * idle resistance) up. Readings do not move apart monotonically as the resistor grows, so each
 * standard value is tried in ascending order, on either line, and the smallest value that leaves
 * every reading, the idle one included, readable and apart wins (ties go to the second line).
 * The idle reading caps the search: a value that pushes a button into it is never suggested.
 */
export function suggestSeparator(lineA: ControlLine, lineB: ControlLine, circuit: Partial<LadderCircuit>, name: ESeries): SeparatorResult {
	const direct = ladderReport([lineA, lineB], circuit);
	if (!direct.collides) return { ok: true, resistorOhms: 0, onLine: null, report: direct };
	for (const line of [lineA, lineB]) {
		const own = ladderReport([line], circuit);
		const clash = own.collisions.find(([a, b]) => !a.idle && !b.idle);
		if (clash) {
			return {
				ok: false,
				reason: `On ${line.name}, "${clash[0].button}" and "${clash[1].button}" already read too close together; no series resistor can separate them.`
			};
		}
	}
	const shifted = (line: ControlLine, r: number): ControlLine => ({
		name: line.name,
		buttons: line.buttons.map((b) => ({ name: b.name, ohms: b.ohms + r })),
		idleOhms: (line.idleOhms ?? direct.circuit.idleOhms ?? Infinity) + r
	});
	for (const r of eValues(name)) {
		for (const [fixed, moved] of [
			[lineA, lineB],
			[lineB, lineA]
		] as const) {
			const report = ladderReport([fixed, shifted(moved, r)], circuit);
			if (!report.collides) return { ok: true, resistorOhms: r, onLine: moved.name, report };
		}
	}
	const t = direct.circuit.tolerancePct;
	return {
		ok: false,
		reason: `No single ${name} resistor separates ${lineA.name} and ${lineB.name} at ±${t} % within the readable range (below the idle reading of ${Math.round(direct.idle.counts)} counts): the readings crowd together near the top of the scale. A smaller pull-up or a second input helps.`
	};
}
