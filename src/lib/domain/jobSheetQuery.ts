import { object, text, type Problem } from './figureRules';
import { readLength, type LengthUnit } from './units';
import { readMaterial, readNumber } from './calcInput';
import { decodeVinBasics } from './vin';
import { modelYearProblem } from './slug';
import { MAX_AMPLIFIERS } from './distribution';
import type { TypedAmplifier } from './jobSheet';
import type { AmpClass } from './power';
import type { CableMaterial } from './wire';
import type { Box } from './fit';
import { readTypedBox } from './typedBox';
import type { DriverGroup } from './coilWiring';
import type { Part } from './part';

// The job sheet's address: typed run lengths (metres, or feet for imperial, unless the text names
// its unit), typed amplifiers (one value of each field a row, in order), the cable, and the
// customer's details. The calculators and the fit screen write the same names.

export type QueryReader = { get(name: string): string | null; getAll(name: string): string[] };

const RUN_FIELDS = ['power', 'remote', 'speaker'] as const;
const LIST_FIELDS = ['ground', 'branch'] as const;
export const TYPED_AMP_FIELDS = ['ampName', 'ampW', 'ampCh', 'ampClass', 'ampA', 'ampFuse'] as const;
export type TypedAmpField = (typeof TYPED_AMP_FIELDS)[number];
export type TypedAmpRow = Record<TypedAmpField, string>;

export interface JobCustomer {
	customer: string;
	order: string;
	vin: string;
	year: string;
}

export interface JobSheetQuery {
	lengths: Partial<Record<(typeof RUN_FIELDS)[number], number>>;
	/** Per amplifier, in order; one figure applies to each. */
	grounds?: number[];
	branches?: number[];
	speakers?: number;
	cores?: number;
	material: CableMaterial;
	remoteOutA?: number;
	typedAmps: TypedAmplifier[];
	/** The rows as typed, for the form to show again. */
	ampRows: TypedAmpRow[];
	customer: JobCustomer;
	/** A box typed on the fit screen, mm. */
	box: Box | null;
	/** Subwoofers typed (count, coils, ohms a coil) or one chosen from the parts (subPart), and how they are wired. */
	subwoofers: { count: number; coils: 1 | 2 | null; ohmsPerCoil: number | null; partId: number | null; ampKey: string | null; bridged: boolean; wiring: number | null } | null;
	vehicleLoadA?: number;
	/** One message per field; a typed amplifier's under "amp1", "amp2" … */
	errors: Record<string, string>;
}

const lengthIn = (text: string, unit: LengthUnit): number | string => {
	try {
		const m = readLength('m', text, unit);
		return !(m >= 0) || m > 30 ? 'A run length is between 0 and 30 m (98 ft).' : m;
	} catch (e) {
		return (e as Error).message;
	}
};

const CUSTOMER = object({
	customer: text(120, 'Keep the customer name under 120 characters.'),
	order: text(40, 'Keep the work order under 40 characters.'),
	vin: text(40, 'A VIN has 17 characters.'),
	year: text(10, 'Model year: type four digits.')
});

/** The customer's details, the VIN checked by its check digit and the model year against the page's years. */
export function readJobCustomer(q: QueryReader, years: { yearFrom: number; yearTo: number }): { customer: JobCustomer; errors: Record<string, string> } {
	const errors: Record<string, string> = {};
	const problems: Problem[] = [];
	const c = CUSTOMER({ customer: q.get('customer') ?? '', order: q.get('order') ?? '', vin: q.get('vin') ?? '', year: q.get('year') ?? '' }, [], problems);
	if (problems.length > 0) {
		for (const problem of problems) errors[String(problem.path[0])] = problem.message;
		return { customer: { customer: '', order: '', vin: '', year: '' }, errors };
	}
	if (c.vin) {
		const vin = decodeVinBasics(c.vin);
		if (vin.problem) errors.vin = vin.problem;
		else c.vin = vin.vin;
	}
	const yearProblem = modelYearProblem(c.year, years);
	if (yearProblem) errors.year = yearProblem;
	return { customer: c, errors };
}

/** Typed amplifier rows: an all-empty row is left out; each other row needs its current, or its power, channels and class. */
export function readTypedAmps(q: QueryReader): { amps: TypedAmplifier[]; rows: TypedAmpRow[]; errors: Record<string, string> } {
	const columns = Object.fromEntries(TYPED_AMP_FIELDS.map((f) => [f, q.getAll(f)])) as Record<TypedAmpField, string[]>;
	const count = Math.max(0, ...TYPED_AMP_FIELDS.map((f) => columns[f].length));
	const rows: TypedAmpRow[] = [];
	for (let i = 0; i < count; i++) {
		const row = Object.fromEntries(TYPED_AMP_FIELDS.map((f) => [f, (columns[f][i] ?? '').trim()])) as TypedAmpRow;
		if (TYPED_AMP_FIELDS.some((f) => f !== 'ampClass' && row[f] !== '')) rows.push(row);
	}
	const errors: Record<string, string> = {};
	const amps: TypedAmplifier[] = [];
	if (rows.length > MAX_AMPLIFIERS) errors.amp1 = `At most ${MAX_AMPLIFIERS} amplifiers on one sheet.`;
	rows.slice(0, MAX_AMPLIFIERS).forEach((row, i) => {
		const key = `amp${i + 1}`;
		const name = row.ampName.slice(0, 80);
		const optional = (text: string, rule: Parameters<typeof readNumber>[1]) => (text === '' ? null : readNumber(text, rule));
		const currentA = optional(row.ampA, { label: 'Current', unit: 'A', above: 0, max: 1000 });
		const fuseA = optional(row.ampFuse, { label: 'Own fuse', unit: 'A', above: 0, max: 1000 });
		const watts = optional(row.ampW, { label: 'RMS power per channel', unit: 'W', above: 0, max: 10_000 });
		const channels = optional(row.ampCh, { label: 'Channels', whole: true, min: 1, max: 16 });
		const ampClass: AmpClass | null = row.ampClass === 'AB' || row.ampClass === 'D' ? row.ampClass : null;
		const problem = [currentA, fuseA, watts, channels].find((v): v is string => typeof v === 'string');
		if (problem) {
			errors[key] = `${name || `Amplifier ${i + 1}`}: ${problem}`;
			return;
		}
		if (currentA === null && (watts === null || channels === null)) {
			errors[key] = `${name || `Amplifier ${i + 1}`}: give its RMS power per channel and channels, or its current.`;
			return;
		}
		amps.push({ name: name || undefined, currentA: currentA as number | null, fuseA: fuseA as number | null, rmsWattsPerChannel: watts as number | null, channels: channels as number | null, ampClass });
	});
	return { amps, rows, errors };
}

function readSubwoofers(q: QueryReader, errors: Record<string, string>): JobSheetQuery['subwoofers'] {
	const text = (name: string) => (q.get(name) ?? '').trim();
	const partId = text('subPart') === '' ? null : Number(text('subPart'));
	if (text('subOhms') === '' && partId === null) return null;
	const count = text('subCount') === '' ? 1 : readNumber(text('subCount'), { label: 'Subwoofers', whole: true, min: 1, max: 8 });
	const ohms = text('subOhms') === '' ? null : readNumber(text('subOhms'), { label: 'Impedance a coil', unit: 'Ω', above: 0, max: 32 });
	const coils = text('subCoils') === '' ? null : text('subCoils') === '2' ? 2 : text('subCoils') === '1' ? 1 : 'Voice coils must be 1 (single) or 2 (dual).';
	const wiring = text('wiring') === '' ? null : readNumber(text('wiring'), { label: 'Wiring', whole: true, min: 0, max: 200 });
	if (typeof count === 'string') errors.subCount = count;
	if (typeof ohms === 'string') errors.subOhms = ohms;
	if (typeof coils === 'string') errors.subCoils = coils;
	if (partId !== null && !(Number.isInteger(partId) && partId > 0)) errors.subPart = 'Choose a subwoofer from the list.';
	if ([count, ohms, coils].some((v) => typeof v === 'string') || errors.subPart) return null;
	return {
		count: count as number,
		coils: coils as 1 | 2 | null,
		ohmsPerCoil: ohms as number | null,
		partId,
		ampKey: text('subAmp') || null,
		bridged: q.get('bridged') === 'on',
		wiring: typeof wiring === 'number' ? wiring : null
	};
}

export function readJobSheetQuery(q: QueryReader, unit: LengthUnit, years: { yearFrom: number; yearTo: number }): JobSheetQuery {
	const errors: Record<string, string> = {};
	const lengths: JobSheetQuery['lengths'] = {};
	for (const f of RUN_FIELDS) {
		const text = (q.get(f) ?? '').trim();
		if (!text) continue;
		const m = lengthIn(text, unit);
		if (typeof m === 'string') errors[f] = m;
		else lengths[f] = m;
	}
	const lists: Partial<Record<(typeof LIST_FIELDS)[number], number[]>> = {};
	for (const f of LIST_FIELDS) {
		const items = (q.get(f) ?? '')
			.split(/[;,]\s*|\s+(?=\d)/)
			.map((s) => s.trim())
			.filter(Boolean);
		if (!items.length) continue;
		const read = items.map((t) => lengthIn(t, unit));
		const bad = read.find((v): v is string => typeof v === 'string');
		if (bad) errors[f] = bad;
		else if (read.length > MAX_AMPLIFIERS) errors[f] = `At most ${MAX_AMPLIFIERS} lengths, one for each amplifier.`;
		else lists[f] = read as number[];
	}
	const out: JobSheetQuery = { lengths, grounds: lists.ground, branches: lists.branch, material: 'copper', typedAmps: [], ampRows: [], customer: { customer: '', order: '', vin: '', year: '' }, box: null, subwoofers: null, errors };
	for (const [name, label, min, max] of [
		['speakers', 'Speakers', 0, 64],
		['cores', 'Cores per cable', 2, 24]
	] as const) {
		const text = q.get(name);
		if (!text) continue;
		const n = readNumber(text, { label, whole: true, min, max });
		if (typeof n === 'string') errors[name] = n;
		else out[name] = n;
	}
	const remoteOut = (q.get('remoteOut') ?? '').trim();
	if (remoteOut) {
		const n = readNumber(remoteOut, { label: "Head unit's remote output", unit: 'A', above: 0, max: 5 });
		if (typeof n === 'string') errors.remoteOut = n;
		else out.remoteOutA = n;
	}
	const material = readMaterial(q.get('material'));
	if ('error' in material) errors.material = material.error;
	else out.material = material.material;
	const typed = readTypedAmps(q);
	out.typedAmps = typed.amps;
	out.ampRows = typed.rows;
	Object.assign(errors, typed.errors);
	const vehicleLoad = (q.get('vehicleLoad') ?? '').trim();
	if (vehicleLoad) {
		const n = readNumber(vehicleLoad, { label: "The vehicle's own load", unit: 'A', min: 0, max: 500 });
		if (typeof n === 'string') errors.vehicleLoad = n;
		else out.vehicleLoadA = n;
	}
	out.subwoofers = readSubwoofers(q, errors);
	// The fit screen hands the box over in millimetres.
	const box = readTypedBox({ l: q.get('boxL') ?? '', w: q.get('boxW') ?? '', h: q.get('boxH') ?? '' }, 'mm');
	out.box = box.box;
	for (const [side, message] of Object.entries(box.errors)) errors[`box${side.toUpperCase()}`] = message;
	const customer = readJobCustomer(q, years);
	out.customer = customer.customer;
	Object.assign(errors, customer.errors);
	return out;
}


/** The subwoofers as drivers: a chosen catalogue speaker's coils and impedance, with typed figures taking precedence. */
export function subwooferDrivers(sub: NonNullable<JobSheetQuery['subwoofers']>, parts: readonly Part[]): DriverGroup | string {
	const part = sub.partId === null ? null : parts.find((p) => p.id === sub.partId);
	if (sub.partId !== null && (!part || part.kind !== 'speaker')) return 'Subwoofer: choose a speaker from the catalogue, or type its coils and impedance.';
	const speaker = part?.kind === 'speaker' ? part : null;
	const coils = sub.coils ?? speaker?.voiceCoils ?? null;
	const ohmsPerCoil = sub.ohmsPerCoil ?? speaker?.ohmsPerCoil ?? speaker?.impedanceOhm ?? null;
	if (coils === null) return 'Subwoofer: say whether it has a single or a dual voice coil.';
	if (ohmsPerCoil === null) return 'Subwoofer: type the impedance of each voice coil.';
	return { count: sub.count, coils, ohmsPerCoil };
}
