import { z } from 'zod';

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

/** Form field: a typed length as millimetres, with the same messages as parseLength. */
export const lengthInputSchema = (defaultUnit: LengthUnit) =>
	z.string().transform((text, ctx) => {
		try {
			return parseLength(text, defaultUnit);
		} catch (e) {
			ctx.issues.push({ code: 'custom', message: (e as Error).message, input: text });
			return z.NEVER;
		}
	});

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
