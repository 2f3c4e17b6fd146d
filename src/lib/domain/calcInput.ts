import { AMP_CLASS_EFFICIENCY, ABYC_E11_CRITICAL_DROP_PCT, DEFAULT_CONDUCTOR_TEMP_C, NOMINAL_VOLTS, type AmpCurrentInput, type AmpClass, type PowerWireInput } from './power';
import { readLength, readOhms, type LengthUnit } from './units';
import { DEFAULT_CIRCUIT, type ControlLine, type ESeries, type LadderCircuit } from './ladder';
import { runLengthProblem } from './sizeRules';
import { DEFAULT_MATERIAL, type CableMaterial } from './wire';
import { MAX_AMPLIFIERS, type DistributionInput } from './distribution';

// The calculators' forms: typed text in, the domain functions' inputs out, with one message per
// field. The same readers run on the server (a GET form without JavaScript) and in the browser.

export type Fields<K extends string> = Partial<Record<K, string>>;
export type Read<K extends string, T> = { ok: true; input: T } | { ok: false; errors: Partial<Record<K, string>> };

// The gauges the table page and the gauge endpoint cover: 4/0 (−3) to 20.
export const AWG_TABLE_GAUGES: readonly number[] = Array.from({ length: 24 }, (_, i) => i - 3);

const NUMBER = /^[+-]?(\d+(\.\d+)?|\.\d+)$/;

type NumberRule = { label: string; unit?: string; min?: number; above?: number; max?: number; whole?: boolean };

/** A typed number, or a message that says what is wrong with it. */
export function readNumber(text: string | undefined, rule: NumberRule): number | string {
	const typed = (text ?? '').trim();
	// A unit is only read after a figure: "abc" stays "abc", never "ab" and a unit.
	const t = typed.replace(/(?<=[\d.])\s*(%|a|v|w|°c|c|ω|ohms?)$/i, '');
	const unit = rule.unit ? ` ${rule.unit}` : '';
	if (t === '') return `Enter ${rule.label.toLowerCase()}${unit ? ` in${unit}` : ''}.`;
	if (/^\d+,\d+$/.test(t)) return `Use a point for decimals: ${t.replace(',', '.')}.`;
	if (!NUMBER.test(t)) return `${rule.label}: "${typed}" is not a number.`;
	const n = Number(t);
	if (rule.whole && !Number.isInteger(n)) return `${rule.label} must be a whole number.`;
	if (rule.above !== undefined && !(n > rule.above)) return `${rule.label} must be more than ${rule.above}${unit}.`;
	if (rule.min !== undefined && n < rule.min) return `${rule.label} must be at least ${rule.min}${unit}.`;
	if (rule.max !== undefined && n > rule.max) return `${rule.label} must be at most ${rule.max}${unit}.`;
	return n;
}

function collect<K extends string>(readers: Record<K, () => number | string>): { values: Record<K, number>; errors: Partial<Record<K, string>> } {
	const values = {} as Record<K, number>;
	const errors: Partial<Record<K, string>> = {};
	for (const key of Object.keys(readers) as K[]) {
		const v = readers[key]();
		if (typeof v === 'string') errors[key] = v;
		else values[key] = v;
	}
	return { values, errors };
}

const done = <K extends string, T>(errors: Partial<Record<K, string>>, make: () => T): Read<K, T> =>
	Object.keys(errors).length ? { ok: false, errors } : { ok: true, input: make() };

// ---- Amplifier current ----

export type AmpClassChoice = AmpClass | 'own';
export type AmpFields = 'watts' | 'channels' | 'ampClass' | 'efficiencyPct' | 'volts';
export const AMP_DEFAULTS: Record<AmpFields, string> = { watts: '', channels: '4', ampClass: 'D', efficiencyPct: '', volts: String(NOMINAL_VOLTS) };

export function readAmpCurrent(f: Fields<AmpFields>): Read<AmpFields, AmpCurrentInput> {
	const cls = (f.ampClass ?? 'D') as AmpClassChoice;
	const { values, errors } = collect<Exclude<AmpFields, 'ampClass'>>({
		watts: () => readNumber(f.watts, { label: 'RMS power per channel', unit: 'W', above: 0, max: 10_000 }),
		channels: () => readNumber(f.channels, { label: 'Channels', whole: true, min: 1, max: 16 }),
		efficiencyPct: () =>
			cls === 'own'
				? readNumber(f.efficiencyPct, { label: 'Efficiency', unit: '%', above: 0, max: 100 })
				: AMP_CLASS_EFFICIENCY[cls in AMP_CLASS_EFFICIENCY ? (cls as AmpClass) : 'D'] * 100,
		volts: () => readNumber(f.volts, { label: 'Supply voltage', unit: 'V', above: 0, max: 60 })
	});
	return done(errors, () => ({ rmsWattsPerChannel: values.watts, channels: values.channels, efficiency: values.efficiencyPct / 100, volts: values.volts }));
}

// ---- Power wire and fuse ----

export type PowerFields = 'currentA' | 'powerLength' | 'groundLength' | 'volts' | 'maxDropPct' | 'tempC' | 'ownFuseA' | 'material';
export const POWER_DEFAULTS: Record<PowerFields, string> = {
	currentA: '',
	powerLength: '',
	groundLength: '0.5',
	volts: String(NOMINAL_VOLTS),
	maxDropPct: String(ABYC_E11_CRITICAL_DROP_PCT),
	tempC: String(DEFAULT_CONDUCTOR_TEMP_C),
	ownFuseA: '',
	material: DEFAULT_MATERIAL
};

/** The cable material chosen in a form: copper unless CCA is picked. */
export function readMaterial(text: string | null | undefined): { material: CableMaterial } | { error: string } {
	const t = (text ?? '').trim().toLowerCase();
	if (t === '' || t === 'copper') return { material: 'copper' };
	if (t === 'cca') return { material: 'cca' };
	return { error: `Cable material "${(text ?? '').trim()}" is not one we stock: choose copper or CCA.` };
}

const length = (text: string | undefined, label: string, unit: LengthUnit, allowZero: boolean): number | string => {
	const t = (text ?? '').trim();
	if (t === '') return `Enter the ${label.toLowerCase()} in ${unit === 'mm' ? 'metres' : 'feet'}.`;
	try {
		const m = readLength('m', t, unit);
		return runLengthProblem(m, label, allowZero) ?? m;
	} catch (e) {
		return `${label}: ${(e as Error).message}`;
	}
};

/** Run lengths are typed in metres (unit "mm") or feet (unit "in"); a unit in the text wins. */
export function readPowerWire(f: Fields<PowerFields>, unit: LengthUnit = 'mm'): Read<PowerFields, PowerWireInput> {
	const material = readMaterial(f.material);
	const { values, errors } = collect<Exclude<PowerFields, 'material'>>({
		currentA: () => readNumber(f.currentA, { label: 'Current', unit: 'A', above: 0, max: 2000 }),
		powerLength: () => length(f.powerLength, 'Power run length', unit, false),
		groundLength: () => length(f.groundLength, 'Ground lead length', unit, true),
		volts: () => readNumber(f.volts, { label: 'Supply voltage', unit: 'V', above: 0, max: 60 }),
		maxDropPct: () => readNumber(f.maxDropPct, { label: 'Allowed voltage drop', unit: '%', above: 0, max: 100 }),
		tempC: () => ((f.tempC ?? '').trim() === '' ? DEFAULT_CONDUCTOR_TEMP_C : readNumber(f.tempC, { label: 'Conductor temperature', unit: '°C', min: -40, max: 150 })),
		// Left empty when the amplifiers' own fuses are not known.
		ownFuseA: () => ((f.ownFuseA ?? '').trim() === '' ? 0 : readNumber(f.ownFuseA, { label: "Amplifiers' own fuses", unit: 'A', above: 0, max: 2000 }))
	});
	const all: Partial<Record<PowerFields, string>> = 'error' in material ? { ...errors, material: material.error } : errors;
	return done(all, () => ({
		currentA: values.currentA,
		powerLengthM: values.powerLength,
		groundLengthM: values.groundLength,
		volts: values.volts,
		maxDropPct: values.maxDropPct,
		tempC: values.tempC,
		ownFuseA: values.ownFuseA || null,
		material: 'material' in material ? material.material : DEFAULT_MATERIAL
	}));
}

// ---- Speaker cable plan ----

export type CableFields = 'speakers' | 'cores' | 'remote';
export const CABLE_DEFAULTS: Record<CableFields, string> = { speakers: '4', cores: '4', remote: '' };

export function readSpeakerCable(f: Fields<CableFields>): Read<CableFields, { speakers: number; coresPerCable: number; includeRemote: boolean }> {
	const { values, errors } = collect<Exclude<CableFields, 'remote'>>({
		speakers: () => readNumber(f.speakers, { label: 'Speakers', whole: true, min: 0, max: 64 }),
		cores: () => readNumber(f.cores, { label: 'Cores per cable', whole: true, min: 2, max: 24 })
	});
	return done(errors, () => ({ speakers: values.speakers, coresPerCable: values.cores, includeRemote: f.remote === 'on' || f.remote === 'true' }));
}

// ---- Impedance ----

export type ImpedanceFields = 'ohms' | 'mode' | 'bankOhms' | 'inSeries' | 'parallel';
export const IMPEDANCE_DEFAULTS: Record<ImpedanceFields, string> = { ohms: '4, 4', mode: 'parallel', bankOhms: '4', inSeries: '2', parallel: '2' };

/** "4, 4, 2" or one a line: a list of speaker impedances in ohms. */
export function readImpedances(text: string | undefined): number[] | string {
	const items = (text ?? '')
		.split(/[,;\n]+/)
		.map((s) => s.trim())
		.filter(Boolean);
	if (items.length === 0) return 'Enter at least one impedance, for example 4, 4.';
	if (items.length > 32) return 'At most 32 speakers.';
	const out: number[] = [];
	for (const item of items) {
		const n = readNumber(item, { label: 'Impedance', unit: 'Ω', above: 0, max: 1000 });
		if (typeof n === 'string') return n;
		out.push(n);
	}
	return out;
}

export function readBank(f: Fields<ImpedanceFields>): Read<'bankOhms' | 'inSeries' | 'parallel', { ohms: number; inSeries: number; parallel: number }> {
	const { values, errors } = collect<'bankOhms' | 'inSeries' | 'parallel'>({
		bankOhms: () => readNumber(f.bankOhms, { label: 'Impedance of each speaker', unit: 'Ω', above: 0, max: 1000 }),
		inSeries: () => readNumber(f.inSeries, { label: 'Speakers in each string', whole: true, min: 1, max: 16 }),
		parallel: () => readNumber(f.parallel, { label: 'Parallel strings', whole: true, min: 1, max: 16 })
	});
	return done(errors, () => ({ ohms: values.bankOhms, inSeries: values.inSeries, parallel: values.parallel }));
}

/** "1k, 2k2, 470": resistances in ohms, resistor codes allowed. */
export function readResistances(text: string | undefined): number[] | string {
	const items = (text ?? '')
		.split(/[,;\n]+/)
		.map((s) => s.trim())
		.filter(Boolean);
	if (items.length === 0) return 'Enter at least one resistance, for example 1k, 2k2.';
	if (items.length > 32) return 'At most 32 resistors.';
	const out: number[] = [];
	for (const item of items) {
		try {
			out.push(readOhms(item, 'Resistor'));
		} catch (e) {
			return (e as Error).message;
		}
	}
	return out;
}

// ---- Steering-wheel ladder ----

export type LadderFields = 'line1' | 'buttons1' | 'line2' | 'buttons2' | 'tolerancePct' | 'series' | 'pullUp' | 'vref' | 'adcBits' | 'idle';
export const LADDER_DEFAULTS: Record<LadderFields, string> = {
	line1: 'Line 1',
	buttons1: '',
	line2: 'Line 2',
	buttons2: '',
	tolerancePct: String(DEFAULT_CIRCUIT.tolerancePct),
	series: 'E24',
	pullUp: '4k7',
	vref: String(DEFAULT_CIRCUIT.vrefV),
	adcBits: String(DEFAULT_CIRCUIT.adcBits),
	idle: 'open'
};

/** A resistance field: resistor codes allowed; empty takes the default. */
function readResistance(text: string | undefined, label: string, fallback: number | null, max: number): number | null | string {
	const t = (text ?? '').trim();
	if (t === '') return fallback;
	try {
		const ohms = readOhms(t, label);
		return ohms > max ? `${label}: over ${max.toLocaleString('en')} Ω looks like a typo.` : ohms;
	} catch (e) {
		return (e as Error).message;
	}
}

/** One button a line: "Volume + = 330", "Next: 1k", or a bare "2k2" (named by position). */
export function readButtons(text: string | undefined, lineName: string): ControlLine | string {
	const rows = (text ?? '')
		.split(/\n|;/)
		.map((s) => s.trim())
		.filter(Boolean);
	const buttons = [];
	for (const [i, row] of rows.entries()) {
		const m = /^(.*?)\s*[=:]\s*([^=:]+)$/.exec(row);
		const name = m ? m[1].trim() || `Button ${i + 1}` : `Button ${i + 1}`;
		try {
			const ohms = readOhms(m ? m[2] : row, `${lineName}, ${name}`);
			if (ohms > 10_000_000) return `${lineName}, ${name}: over 10 MΩ looks like a typo.`;
			buttons.push({ name, ohms });
		} catch (e) {
			return (e as Error).message;
		}
	}
	if (buttons.length > 30) return `${lineName}: at most 30 buttons.`;
	return { name: lineName, buttons };
}

export function readLadder(f: Fields<LadderFields>): Read<LadderFields, { lines: ControlLine[]; tolerancePct: number; circuit: LadderCircuit; series: ESeries }> {
	const errors: Partial<Record<LadderFields, string>> = {};
	const lines: ControlLine[] = [];
	for (const [nameKey, buttonsKey] of [
		['line1', 'buttons1'],
		['line2', 'buttons2']
	] as const) {
		const name = (f[nameKey] ?? '').trim() || (nameKey === 'line1' ? 'Line 1' : 'Line 2');
		const line = readButtons(f[buttonsKey], name);
		if (typeof line === 'string') errors[buttonsKey] = line;
		else if (line.buttons.length) lines.push(line);
	}
	if (lines.length === 0 && !errors.buttons1 && !errors.buttons2) errors.buttons1 = 'Enter at least one button and its resistance, for example "Volume + = 330".';
	const tol = readNumber(f.tolerancePct, { label: 'Tolerance', unit: '%', min: 0, max: 50 });
	if (typeof tol === 'string') errors.tolerancePct = tol;
	const pullUp = readResistance(f.pullUp, 'Pull-up', DEFAULT_CIRCUIT.pullUpOhms, 10_000_000);
	if (typeof pullUp === 'string') errors.pullUp = pullUp;
	else if (!(pullUp !== null && pullUp > 0)) errors.pullUp = 'Pull-up must be more than 0 Ω.';
	const vref = (f.vref ?? '').trim() === '' ? DEFAULT_CIRCUIT.vrefV : readNumber(f.vref, { label: 'Reference voltage', unit: 'V', above: 0, max: 60 });
	if (typeof vref === 'string') errors.vref = vref;
	const bits = (f.adcBits ?? '').trim() === '' ? DEFAULT_CIRCUIT.adcBits : readNumber(f.adcBits, { label: 'ADC resolution', unit: 'bits', whole: true, min: 6, max: 24 });
	if (typeof bits === 'string') errors.adcBits = bits;
	// "open", "∞" or nothing: the line reads open circuit when no button is pressed.
	const idleText = (f.idle ?? '').trim();
	const idle = /^(open|∞|inf(inity)?|oc)?$/i.test(idleText) ? null : readResistance(idleText, 'Idle line', null, 100_000_000);
	if (typeof idle === 'string') errors.idle = idle;
	const series: ESeries = f.series === 'E12' ? 'E12' : 'E24';
	return done(errors, () => ({
		lines,
		tolerancePct: tol as number,
		circuit: { pullUpOhms: pullUp as number, vrefV: vref as number, adcBits: bits as number, tolerancePct: tol as number, idleOhms: idle as number | null },
		series
	}));
}

/** A line as form text, for filling the form from a vehicle page. */
export function buttonsText(line: ControlLine): string {
	return line.buttons.map((b) => `${b.name} = ${b.ohms}`).join('\n');
}

// ---- Several amplifiers on one run ----

export interface DistributionRow {
	currentA: string;
	fuseA: string;
	branch: string;
	ground: string;
}
export type DistributionFields = 'mainLength' | 'material' | 'remoteOut';
export const DISTRIBUTION_DEFAULTS: Record<DistributionFields, string> = { mainLength: '', material: DEFAULT_MATERIAL, remoteOut: '' };
export const emptyDistributionRow = (): DistributionRow => ({ currentA: '', fuseA: '', branch: '0.5', ground: '0.5' });

/** The distribution form: one row an amplifier (rows left wholly empty are skipped); errors keyed by field or "row1.currentA". */
export function readDistribution(rows: readonly DistributionRow[], f: Fields<DistributionFields>, unit: LengthUnit = 'mm'): Read<string, DistributionInput> {
	const errors: Record<string, string> = {};
	const used = rows.filter((r) => r.currentA.trim() !== '' || r.fuseA.trim() !== '');
	if (used.length === 0) errors['row1.currentA'] = 'Enter the current of at least one amplifier.';
	if (used.length > MAX_AMPLIFIERS) errors.form = `At most ${MAX_AMPLIFIERS} amplifiers on one run.`;
	const amps: { currentA: number; fuseA: number | null }[] = [];
	const branches: number[] = [];
	const grounds: number[] = [];
	used.forEach((r, i) => {
		const at = (k: keyof DistributionRow) => `row${i + 1}.${k}`;
		const current = readNumber(r.currentA, { label: 'Current', unit: 'A', above: 0, max: 1000 });
		const fuse = r.fuseA.trim() === '' ? null : readNumber(r.fuseA, { label: 'Own fuse', unit: 'A', above: 0, max: 1000 });
		const branch = length(r.branch, 'Branch length', unit, false);
		const ground = length(r.ground, 'Ground lead length', unit, true);
		if (typeof current === 'string') errors[at('currentA')] = current;
		if (typeof fuse === 'string') errors[at('fuseA')] = fuse;
		if (typeof branch === 'string') errors[at('branch')] = branch;
		if (typeof ground === 'string') errors[at('ground')] = ground;
		if (typeof current === 'number' && typeof fuse !== 'string') amps.push({ currentA: current, fuseA: fuse });
		if (typeof branch === 'number') branches.push(branch);
		if (typeof ground === 'number') grounds.push(ground);
	});
	const main = length(f.mainLength, 'Main cable length', unit, false);
	if (typeof main === 'string') errors.mainLength = main;
	const material = readMaterial(f.material);
	if ('error' in material) errors.material = material.error;
	const remote = (f.remoteOut ?? '').trim() === '' ? null : readNumber(f.remoteOut, { label: "Head unit's remote output", unit: 'A', above: 0, max: 5 });
	if (typeof remote === 'string') errors.remoteOut = remote;
	return done(errors, () => ({
		amps,
		mainLengthM: main as number,
		branchLengthsM: amps.length > 1 ? branches : [],
		groundLengthsM: grounds,
		material: 'material' in material ? material.material : DEFAULT_MATERIAL,
		headUnitRemoteA: remote as number | null
	}));
}
