// Lengths are stored metric (mm for parts and spaces, m for cable runs) and only
// converted for display or when a person types imperial.

export type UnitSystem = 'metric' | 'imperial';
export type LengthUnit = 'mm' | 'in';

// International inch and foot (1959 agreement): exact by definition.
export const MM_PER_INCH = 25.4;
export const M_PER_FOOT = 0.3048;

export const mmToIn = (mm: number): number => mm / MM_PER_INCH;
export const inToMm = (inches: number): number => inches * MM_PER_INCH;
export const mToFt = (m: number): number => m / M_PER_FOOT;
export const ftToM = (ft: number): number => ft * M_PER_FOOT;

export class LengthInputError extends Error {
	constructor(message: string) {
		super(message);
		this.name = 'LengthInputError';
	}
}

const MM_PER_UNIT: Record<string, number> = {
	mm: 1,
	cm: 10,
	m: 1000,
	in: MM_PER_INCH,
	inch: MM_PER_INCH,
	inches: MM_PER_INCH,
	'"': MM_PER_INCH,
	ft: 304.8,
	foot: 304.8,
	feet: 304.8,
	"'": 304.8
};

const UNIT = `(inches|inch|in|mm|cm|m|feet|foot|ft|"|')?`;
const DECIMAL = new RegExp(`^(\\d+(?:\\.\\d+)?|\\.\\d+)\\s*${UNIT}$`);
const FRACTION = new RegExp(`^(\\d+)\\s*/\\s*(\\d+)\\s*${UNIT}$`);
// "3 1/2 in" and "3-1/2 in", the way imperial sizes are written on a tape.
const MIXED = new RegExp(`^(\\d+)(?:\\s+|\\s*-\\s*)(\\d+)\\s*/\\s*(\\d+)\\s*${UNIT}$`);

const EXAMPLES = 'for example 89, 89 mm, 3.5 in, 3.5" or 3 1/2 in';
const RUN_EXAMPLES: Record<LengthUnit, string> = {
	mm: 'for example 4.5 (metres), 4.5 m, 450 cm or 15 ft',
	in: 'for example 15 (feet), 15 ft, 4.5 m or 450 cm'
};

/** Reads a typed length and returns millimetres; throws LengthInputError with a message for a person. */
export function parseLength(input: string, defaultUnit: LengthUnit): number {
	const text = input
		.trim()
		.toLowerCase()
		.replace(/[″“”]/g, '"')
		.replace(/[′‘’]/g, "'");
	if (text === '') throw new LengthInputError(`Enter a length, ${EXAMPLES}.`);
	if (text.startsWith('-')) throw new LengthInputError('A length cannot be negative.');
	if (/^\d+,\d+/.test(text)) {
		throw new LengthInputError(`Use a point for decimals: ${text.replace(',', '.')}.`);
	}

	let value: number;
	let unit: string | undefined;
	let m: RegExpExecArray | null;
	if ((m = DECIMAL.exec(text))) {
		value = Number(m[1]);
		unit = m[2];
	} else if ((m = FRACTION.exec(text))) {
		value = fraction(m[1], m[2], input);
		unit = m[3];
	} else if ((m = MIXED.exec(text))) {
		value = Number(m[1]) + fraction(m[2], m[3], input);
		unit = m[4];
	} else {
		throw new LengthInputError(`Could not read "${input.trim()}" as a length; ${EXAMPLES}.`);
	}
	return value * MM_PER_UNIT[unit ?? defaultUnit];
}

function fraction(numerator: string, denominator: string, input: string): number {
	const d = Number(denominator);
	if (d === 0) throw new LengthInputError(`"${input.trim()}" divides by zero.`);
	return Number(numerator) / d;
}

export interface FormatOptions {
	/** Digits after the point; metric mm default 0, inches 2, run lengths 1. */
	decimals?: number;
	/** Text for a missing value. */
	missing?: string;
}

function fixed(value: number, decimals: number): string {
	const text = value.toFixed(decimals);
	return Number(text) === 0 ? (0).toFixed(decimals) : text;
}

/** A part or space dimension, e.g. "95 mm" or "3.74 in". */
export function formatLength(
	mm: number | null | undefined,
	system: UnitSystem,
	opts: FormatOptions = {}
): string {
	if (mm == null || !Number.isFinite(mm)) return opts.missing ?? '—';
	return system === 'metric'
		? `${fixed(mm, opts.decimals ?? 0)} mm`
		: `${fixed(mmToIn(mm), opts.decimals ?? 2)} in`;
}

/** A cable run length, e.g. "4.5 m" or "14.8 ft". */
export function formatMetres(
	m: number | null | undefined,
	system: UnitSystem,
	opts: FormatOptions = {}
): string {
	if (m == null || !Number.isFinite(m)) return opts.missing ?? '—';
	return system === 'metric'
		? `${fixed(m, opts.decimals ?? 1)} m`
		: `${fixed(mToFt(m), opts.decimals ?? 1)} ft`;
}

// ---- Measures typed into forms ----

/** The unit a length field is typed in: spaces in mm or in, cable runs in m or ft. */
export function inputUnit(kind: 'mm' | 'm', unit: LengthUnit): string {
	if (kind === 'mm') return unit;
	return unit === 'mm' ? 'm' : 'ft';
}

const MM_PER_INPUT: Record<string, number> = { mm: 1, in: MM_PER_INCH, m: 1000, ft: 304.8 };
// Enough digits that a tape reading survives: 0.1 mm, 0.01 in, 1 cm on a run.
const DECIMALS: Record<string, number> = { mm: 1, in: 2, m: 2, ft: 2 };

const trimmed = (value: number, decimals: number) => String(Number(value.toFixed(decimals)));

/** A stored length (mm for spaces, m for runs) as form text in the form's unit. */
export function lengthText(kind: 'mm' | 'm', stored: number | null, unit: LengthUnit): string {
	if (stored === null || !Number.isFinite(stored)) return '';
	const shown = inputUnit(kind, unit);
	const mm = kind === 'mm' ? stored : stored * 1000;
	return trimmed(mm / MM_PER_INPUT[shown], DECIMALS[shown]);
}

const HAS_UNIT = /[a-z"'″′“”‘’]/i;

/** Typed text to a stored length: mm for spaces, m for runs. A bare number is in the form's unit. */
export function readLength(kind: 'mm' | 'm', text: string, unit: LengthUnit): number {
	// To the micrometre: drops float noise such as 3.5 in = 88.89999999999999 mm.
	if (kind === 'mm') return Math.round(parseLength(text, unit) * 1000) / 1000;
	const withUnit = HAS_UNIT.test(text) ? text : `${text.trim()} ${inputUnit('m', unit)}`;
	try {
		return Math.round(parseLength(withUnit, 'mm') * 1000) / 1_000_000;
	} catch (e) {
		// A run is metres or feet: its examples say so, not the millimetres of a seat space.
		if (!(e instanceof LengthInputError) || !/^(Enter|Could not read)/.test(e.message)) throw e;
		const typed = text.trim();
		throw new LengthInputError(`${typed ? `Could not read "${typed}" as a run length` : 'Enter a run length'}; ${RUN_EXAMPLES[unit]}.`);
	}
}

const OHMS = /^(\d+(?:\.\d+)?|\.\d+)\s*([kKmM])?\s*(?:Ω|ohms?|r)?$/i;
// Resistor code letters standing in for the decimal point: 4k7 = 4.7 kΩ, 2R2 = 2.2 Ω (IEC 60062).
const OHMS_CODE = /^(\d+)([kKmMRr])(\d+)$/;
const PREFIX: Record<string, number> = { k: 1e3, K: 1e3, M: 1e6, R: 1, r: 1 };

/** A typed resistance in ohms: 680, 2.2k, 4k7, 1M, 2R2. */
export function readOhms(text: string, label = 'Resistance'): number {
	const t = text.trim();
	const m = OHMS_CODE.exec(t) ?? OHMS.exec(t);
	if (!m) throw new Error(`${label}: could not read "${t}" as ohms; for example 680, 2.2k or 4k7.`);
	const [, whole, prefix, fraction] = m;
	// IEC 60062 writes milli as "m"; no button or resistor here is read in milliohms.
	if (prefix === 'm') {
		throw new Error(`${label}: "${t}" uses "m", which means milli (thousandths of an ohm); for megaohms type a capital M, for example 2.2M.`);
	}
	// The code form (three groups) puts its letter where the decimal point goes.
	const value = Number(m.length === 4 ? `${whole}.${fraction}` : whole);
	return value * (prefix ? PREFIX[prefix] : 1);
}

const AMPS = /^(\d+(?:\.\d+)?|\.\d+)\s*a?$/i;

/** A typed fuse rating in amps: 10, 7.5 A. */
export function readAmps(text: string, label = 'Fuse'): number {
	const m = AMPS.exec(text.trim());
	if (m) return Number(m[1]);
	throw new Error(`${label}: could not read "${text.trim()}" as amps; for example 10 or 7.5 A.`);
}
