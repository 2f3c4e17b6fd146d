import { AMP_CLASS_EFFICIENCY, ABYC_E11_CRITICAL_DROP_PCT, DEFAULT_CONDUCTOR_TEMP_C, NOMINAL_VOLTS, type AmpCurrentInput, type AmpClass, type PowerWireInput } from './power';
import { readLength, readOhms, type LengthUnit } from './units';
import { DEFAULT_CIRCUIT, type ControlLine, type ESeries, type LadderCircuit } from './ladder';
import { runLengthProblem } from './sizeRules';
import { DEFAULT_MATERIAL, type CableMaterial } from './wire';
import { MAX_AMPLIFIERS, type DistributionInput } from './distribution';
import { MAX_DRIVERS, type DriverGroup } from './coilWiring';
import type { ChargingInput } from './charging';
import { ENCLOSURE_INPUT, type EnclosureInput } from './boxVolume';
import { SEALED_INPUT, type SealedInput } from './sealedBox';
import type { Problem, Rule } from './figureRules';

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
	const t = typed.replace(/(?<=[\d.])\s*(%|a|v|w|°c|c|ω|ohms?|hz|l)$/i, '');
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

// ---- Subwoofer wiring ----

export type CoilFields = 'count' | 'coils' | 'ohmsPerCoil' | 'bridged' | 'amp';
export const COIL_DEFAULTS: Record<CoilFields, string> = { count: '2', coils: '2', ohmsPerCoil: '4', bridged: '', amp: '' };

const ticked = (text: string | undefined) => text === 'on' || text === 'true' || text === 'yes';

export function readCoilWiring(f: Fields<CoilFields>): Read<CoilFields, { drivers: DriverGroup[]; bridged: boolean; ampId: number | null }> {
	const { values, errors } = collect<'count' | 'ohmsPerCoil' | 'coils' | 'amp'>({
		count: () => readNumber(f.count, { label: 'Number of drivers', whole: true, min: 1, max: MAX_DRIVERS }),
		coils: () => readNumber(f.coils, { label: 'Voice coils', whole: true, min: 1, max: 2 }),
		ohmsPerCoil: () => readNumber(f.ohmsPerCoil, { label: 'Impedance per coil', unit: 'Ω', above: 0, max: 32 }),
		amp: () => ((f.amp ?? '').trim() === '' ? 0 : readNumber(f.amp, { label: 'Amplifier', whole: true, min: 1, max: 2 ** 31 }))
	});
	return done(errors, () => ({
		drivers: [{ count: values.count, coils: values.coils as 1 | 2, ohmsPerCoil: values.ohmsPerCoil }],
		bridged: ticked(f.bridged),
		ampId: values.amp || null
	}));
}

// ---- Charging budget ----

export type ChargingFields = 'alternatorA' | 'alternatorIdleA' | 'vehicleLoadA' | 'addedLoadA' | 'restingV' | 'runningV' | 'material';
export const CHARGING_DEFAULTS: Record<ChargingFields, string> = { alternatorA: '', alternatorIdleA: '', vehicleLoadA: '', addedLoadA: '', restingV: '', runningV: '', material: DEFAULT_MATERIAL };

/** The budget's figures, and the voltmeter readings at the battery when they were taken. */
export interface ChargingQuery {
	budget: ChargingInput;
	restingV: number | null;
	runningV: number | null;
}

// Left empty when not known or not measured.
const optional = (text: string | undefined, rule: NumberRule): number | null | string => ((text ?? '').trim() === '' ? null : readNumber(text, rule));

export function readCharging(f: Fields<ChargingFields>): Read<ChargingFields, ChargingQuery> {
	const errors: Partial<Record<ChargingFields, string>> = {};
	const got = <T>(key: ChargingFields, v: T | string): T => {
		if (typeof v === 'string') errors[key] = v;
		return v as T;
	};
	const alternatorA = got<number>('alternatorA', readNumber(f.alternatorA, { label: 'Alternator output at cruise', unit: 'A', above: 0, max: 500 }));
	const alternatorIdleA = got<number | null>('alternatorIdleA', optional(f.alternatorIdleA, { label: 'Alternator output at idle', unit: 'A', min: 0, max: 500 }));
	const vehicleLoadA = got<number>('vehicleLoadA', readNumber(f.vehicleLoadA, { label: "The vehicle's own load", unit: 'A', min: 0, max: 500 }));
	const addedLoadA = got<number>('addedLoadA', readNumber(f.addedLoadA, { label: 'Added load', unit: 'A', min: 0, max: 1000 }));
	const restingV = got<number | null>('restingV', optional(f.restingV, { label: 'Battery at rest', unit: 'V', above: 0, max: 20 }));
	const runningV = got<number | null>('runningV', optional(f.runningV, { label: 'Battery running', unit: 'V', above: 0, max: 20 }));
	if (!errors.alternatorA && !errors.alternatorIdleA && alternatorIdleA !== null && alternatorIdleA > alternatorA) {
		errors.alternatorIdleA = "The alternator's output at idle cannot be more than at cruise.";
	}
	const cable = readMaterial(f.material);
	if ('error' in cable) errors.material = cable.error;
	const material = 'material' in cable ? cable.material : DEFAULT_MATERIAL;
	return done(errors, () => ({ budget: { alternatorA, alternatorIdleA, vehicleLoadA, addedLoadA, material }, restingV, runningV }));
}

// ---- Box volume and port ----

export type BoxFields = 'l' | 'w' | 'h' | 'wallMm' | 'driverL' | 'port' | 'diameterMm' | 'slotWidthMm' | 'slotHeightMm' | 'portLengthMm';
export const BOX_DEFAULTS: Record<BoxFields, string> = {
	l: '',
	w: '',
	h: '',
	wallMm: '18',
	driverL: '0',
	port: 'none',
	diameterMm: '',
	slotWidthMm: '',
	slotHeightMm: '',
	portLengthMm: ''
};

/** A size in mm; "19.5 in" or "50 cm" are read in their own unit. */
const size = (text: string | undefined, label: string): number | string => {
	const t = (text ?? '').trim();
	if (t === '') return `Enter the ${label.toLowerCase()} in mm.`;
	try {
		const mm = readLength('mm', t, 'mm');
		return mm > 0 ? mm : `${label} must be more than 0 mm.`;
	} catch (e) {
		return `${label}: ${(e as Error).message}`;
	}
};

/** The form's figures as the enclosure input; the schema then checks that they make a box. */
export function readBox(f: Fields<BoxFields>): Read<BoxFields, EnclosureInput> {
	const port = f.port === 'round' || f.port === 'slot' ? f.port : 'none';
	const { values, errors } = collect<Exclude<BoxFields, 'port'>>({
		l: () => size(f.l, 'Outside length'),
		w: () => size(f.w, 'Outside width'),
		h: () => size(f.h, 'Outside height'),
		wallMm: () => size(f.wallMm, 'Wall thickness'),
		driverL: () => ((f.driverL ?? '').trim() === '' ? 0 : readNumber(f.driverL, { label: 'Driver displacement', unit: 'L', min: 0, max: 200 })),
		diameterMm: () => (port === 'round' ? size(f.diameterMm, 'Port diameter') : 0),
		slotWidthMm: () => (port === 'slot' ? size(f.slotWidthMm, 'Slot width') : 0),
		slotHeightMm: () => (port === 'slot' ? size(f.slotHeightMm, 'Slot height') : 0),
		portLengthMm: () => (port === 'none' ? 0 : size(f.portLengthMm, 'Port length'))
	});
	if (Object.keys(errors).length) return { ok: false, errors };
	const input: EnclosureInput = {
		outside: { l: values.l, w: values.w, h: values.h },
		wallMm: values.wallMm,
		driverDisplacementL: values.driverL,
		port:
			port === 'round'
				? { kind: 'round', diameterMm: values.diameterMm, lengthMm: values.portLengthMm }
				: port === 'slot'
					? { kind: 'slot', widthMm: values.slotWidthMm, heightMm: values.slotHeightMm, lengthMm: values.portLengthMm }
					: undefined
	};
	return ruleRead(ENCLOSURE_INPUT, input, BOX_PATHS);
}

// Where a complaint about the enclosure belongs on the form.
const BOX_PATHS: Record<string, BoxFields> = {
	'outside.l': 'l',
	'outside.w': 'w',
	'outside.h': 'h',
	wallMm: 'wallMm',
	driverDisplacementL: 'driverL',
	'port.diameterMm': 'diameterMm',
	'port.widthMm': 'slotWidthMm',
	'port.heightMm': 'slotHeightMm',
	'port.lengthMm': 'portLengthMm'
};

/** The figures checked by the domain's own rule, each complaint put on its form field. */
function ruleRead<K extends string, T>(rule: Rule<unknown>, input: T, paths: Record<string, K>): Read<K, T> {
	const problems: Problem[] = [];
	rule(input, [], problems);
	if (problems.length === 0) return { ok: true, input };
	const errors: Partial<Record<K, string>> = {};
	for (const problem of problems) {
		const field = paths[problem.path.join('.')] ?? (Object.values(paths)[0] as K);
		errors[field] ??= problem.message;
	}
	return { ok: false, errors };
}

// ---- Sealed box ----

export type SealedFields = 'fsHz' | 'qts' | 'vasL' | 'qtc';
export const SEALED_DEFAULTS: Record<SealedFields, string> = { fsHz: '', qts: '', vasL: '', qtc: '0.707' };

export function readSealed(f: Fields<SealedFields>): Read<SealedFields, SealedInput> {
	const { values, errors } = collect<SealedFields>({
		fsHz: () => readNumber(f.fsHz, { label: 'Fs', unit: 'Hz', above: 0, max: 500 }),
		qts: () => readNumber(f.qts, { label: 'Qts', above: 0, max: 3 }),
		vasL: () => readNumber(f.vasL, { label: 'Vas', unit: 'L', above: 0, max: 2000 }),
		qtc: () => readNumber(f.qtc, { label: 'Qtc', above: 0, max: 3 })
	});
	if (Object.keys(errors).length) return { ok: false, errors };
	return ruleRead(SEALED_INPUT, { fsHz: values.fsHz, qts: values.qts, vasL: values.vasL, qtc: values.qtc }, { fsHz: 'fsHz', qts: 'qts', vasL: 'vasL', qtc: 'qtc' });
}
