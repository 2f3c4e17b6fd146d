import type { VehicleContent } from './content/schema';
import { ampCurrent, ABYC_E11_CRITICAL_DROP_PCT, AMP_CLASS_EFFICIENCY, electricalBasis, NOMINAL_VOLTS, type AmpClass, type PowerWireResult } from './power';
import { FUSE_CAUTIONS, MAIN_FUSE_MAX_DISTANCE_MM, mainFuse, type MainFuseResult } from './fuse';
import { awgWire, DEFAULT_MATERIAL, gaugeLabel, type CableMaterial } from './wire';
import { DEFAULT_GROUND_M, distributionPlan, type DistributionPlan } from './distribution';
import { speakerCablePlan, type SpeakerCablePlan } from './speaker';
import { DEFAULT_CIRCUIT, ladderReport, suggestSeparator, type ControlLine, type LadderReport, type SeparatorResult } from './ladder';
import { amplifierEfficiency, partBox, type Amplifier, type Part, type Speaker } from './part';
import { dashFit, pickLocation, pickSpace, seatSpaceFits, speakerLocationFits, type LocationFit, type SpaceFit } from './fitCheck';
import type { Box, DepthFit } from './fit';
import { loadPlan, type AmpLoadFigures, type DriverGroup, type LoadOption } from './coilWiring';
import { chargingBudget, type ChargingBudget } from './charging';

// What an installer takes to the car: lengths to cut, gauge, fuse, where things go, what to
// watch for. Everything here is worked out from the page and the chosen parts.

export { DEFAULT_GROUND_M };
// Cut about 10 % long for routing and a service loop (common practice).
export const CUT_SLACK = 0.1;
// Remote turn-on draws well under an amp; 18 AWG is the usual lead (common practice).
export const REMOTE_AWG = 18;
// Speaker leads: keep the loop resistance under about 5 % of the speaker's impedance (common practice).
export const SPEAKER_LOSS_SHARE = 0.05;
export const SPEAKER_GAUGES: readonly number[] = [18, 16, 14, 12, 10];
// Car speakers are most often 4 Ω nominal (common practice); used when no chosen speaker says.
export const NOMINAL_SPEAKER_OHMS = 4;

export const WORK_CAUTIONS: readonly string[] = [
	...FUSE_CAUTIONS.slice(0, 3),
	'Keep clear of airbag (SRS) wiring and connectors, usually yellow; never probe or splice them.',
	'Check behind every panel before drilling: brake and fuel lines and looms run just behind metal.',
	'Use a grommet wherever a cable passes through metal, and seal the hole.',
	FUSE_CAUTIONS[3]
];

/** An amplifier typed on the sheet: its power, channels and class, or its current; its own fuse. */
export interface TypedAmplifier {
	name?: string;
	rmsWattsPerChannel?: number | null;
	channels?: number | null;
	ampClass?: AmpClass | null;
	currentA?: number | null;
	fuseA?: number | null;
}

export interface JobSheetInput {
	content: VehicleContent;
	parts: readonly Part[];
	/** Amplifiers typed in, beside (or instead of) catalogue ones. */
	typedAmps?: readonly TypedAmplifier[];
	/** A power run recorded on the page; its length is the default for the power cable. */
	powerRunId?: string | null;
	/** Lengths in metres typed by the installer; each overrides the page's figure. */
	powerM?: number | null;
	/** One ground lead per amplifier, in order; a single figure applies to each. */
	groundM?: number | null | readonly number[];
	/** Distribution block to each amplifier, in order; a single figure applies to each. */
	branchM?: number | null | readonly number[];
	remoteM?: number | null;
	speakerM?: number | null;
	speakers?: number | null;
	coresPerCable?: number;
	remoteInSpeakerCable?: boolean;
	/** The seat space (id or seat) the amplifier or box goes in; otherwise the best one. */
	seat?: string | null;
	speakerLocation?: string | null;
	volts?: number;
	maxDropPct?: number;
	material?: CableMaterial;
	/** The head unit's remote output rating, A, when known. */
	headUnitRemoteA?: number | null;
	/** A box typed on the fit screen (mm), placed like a catalogue enclosure. */
	box?: Box | null;
	/** Subwoofers on one amplifier: the drivers, which amplifier (its key), bridged or not, and the wiring picked. */
	subwoofers?: { drivers: DriverGroup; ampKey?: string | null; bridged?: boolean; wiring?: number | null } | null;
	/** The vehicle's own electrical load, A, for the charging budget. */
	vehicleLoadA?: number | null;
}

export interface SheetLoad {
	ampKey: string;
	ampLabel: string;
	drivers: DriverGroup;
	bridged: boolean;
	options: LoadOption[];
	/** Index into options of the wiring on the sheet, or null when none suits the amplifier. */
	chosen: number | null;
	/** Whether the wiring was picked by the installer or by the sheet. */
	picked: 'typed' | 'best';
}

export interface CutLine {
	item: 'power' | 'branch' | 'ground' | 'remote' | 'speaker';
	label: string;
	count: number;
	/** Measured (or typed) length of one run, m; null when nobody has measured it. */
	lengthM: number | null;
	/** What to cut for one run, m, slack included. */
	cutM: number | null;
	gauge: string | null;
	note: string;
}

export interface Mounting {
	part: Part;
	seat?: { chosen: SpaceFit | null; all: SpaceFit[] };
	dash?: DepthFit;
	speaker?: { chosen: LocationFit | null; all: LocationFit[] };
}

/** One amplifier on the sheet, from the catalogue or typed. */
export interface SheetAmplifier {
	key: string;
	/** The maker's load figures (rated power at 4, 2 and 1 Ω, minimum load, bridging), when known. */
	loadFigures: AmpLoadFigures | null;
	label: string;
	currentA: number;
	/** At the running voltage; null when the current was typed rather than worked out. */
	runningCurrentA: number | null;
	channels: number | null;
	fuseA: number | null;
	/** How the draw was found, in words. */
	detail: string;
	part: Amplifier | null;
}

export interface JobSheet {
	amplifiers: SheetAmplifier[];
	currentA: number;
	/** The electrical basis every figure on the sheet was worked on, in words. */
	basis: string;
	volts: number;
	material: CableMaterial;
	powerRun: { id: string | null; to: string; lengthM: number | null; typed: boolean };
	/** Main cable, branches, grounds and remote turn-on: the one distribution computation. */
	distribution: DistributionPlan | null;
	wire: PowerWireResult | null;
	fuse: (MainFuseResult & { withinMm: number; spot: string }) | null;
	cutList: CutLine[];
	speakerCable: (SpeakerCablePlan & { gauge: string }) | null;
	mounting: Mounting[];
	/** The load the subwoofer amplifier sees, every wiring checked. */
	load: SheetLoad | null;
	charging: ChargingBudget | null;
	/** The typed box and where it goes. */
	typedBox: { box: Box; seat: { chosen: SpaceFit | null; all: SpaceFit[] } } | null;
	ladder: { report: LadderReport; separator: SeparatorResult | null; lines: ControlLine[] } | null;
	cautions: string[];
	/** Things the sheet could not work out, in words. */
	gaps: string[];
	/** Figures the sheet assumed because nobody gave them, in words. */
	assumptions: string[];
}

export const cutLength = (lengthM: number): number => Math.ceil(lengthM * (1 + CUT_SLACK) * 10 - 1e-9) / 10;

/**
 * Thinnest speaker lead whose loop (out and back) stays under the loss share of the impedance;
 * when none does, the heaviest, with `meets` false.
 */
export function speakerGauge(lengthM: number, impedanceOhm: number, material: CableMaterial = DEFAULT_MATERIAL): { gauge: number; meets: boolean } {
	const limit = SPEAKER_LOSS_SHARE * impedanceOhm;
	for (const g of SPEAKER_GAUGES) {
		if ((awgWire(g, 20, material).ohmsPerKm * 2 * lengthM) / 1000 <= limit) return { gauge: g, meets: true };
	}
	return { gauge: SPEAKER_GAUGES[SPEAKER_GAUGES.length - 1], meets: false };
}

const AMP_CLASS_NAMES: Readonly<Record<AmpClass, string>> = { AB: 'class A/B', D: 'class D' };

/** A typed amplifier's draw: its current as typed, or worked out from power, channels and class. */
export function typedAmplifier(t: TypedAmplifier, index: number, volts: number): SheetAmplifier | string {
	const label = t.name?.trim() || `Typed amplifier ${index + 1}`;
	const fuseA = t.fuseA ?? null;
	if (t.currentA != null) {
		return { key: `typed-${index}`, loadFigures: null, label, currentA: t.currentA, runningCurrentA: null, channels: t.channels ?? null, fuseA, detail: 'current as typed', part: null };
	}
	if (t.rmsWattsPerChannel == null || t.channels == null) return `${label}: give its RMS power per channel and channels, or its current.`;
	if (t.ampClass == null) return `${label}: choose its class (A/B or D), or type its current.`;
	const efficiency = AMP_CLASS_EFFICIENCY[t.ampClass];
	const draw = ampCurrent({ rmsWattsPerChannel: t.rmsWattsPerChannel, channels: t.channels, efficiency, volts });
	return {
		key: `typed-${index}`,
		loadFigures: null,
		label,
		currentA: draw.currentA,
		runningCurrentA: draw.runningCurrentA,
		channels: t.channels,
		fuseA,
		detail: `${t.channels} × ${t.rmsWattsPerChannel} W RMS, ${AMP_CLASS_NAMES[t.ampClass]} at a typical ${Math.round(efficiency * 100)} % (common practice)`,
		part: null
	};
}

// With no amplifier named, the subwoofers go on the one with the fewest channels (a mono amplifier, usually).
function sheetLoad(subs: JobSheetInput['subwoofers'], amplifiers: readonly SheetAmplifier[], gaps: string[]): SheetLoad | null {
	if (!subs) return null;
	const amp = amplifiers.find((a) => a.key === subs.ampKey) ?? [...amplifiers].sort((a, b) => (a.channels ?? 99) - (b.channels ?? 99))[0];
	if (!amp) {
		gaps.push('Subwoofers: choose the amplifier that drives them.');
		return null;
	}
	const bridged = !!subs.bridged;
	// A typed amplifier has no load figures: its minimum load is taken as the conservative 4 Ω.
	const figures: AmpLoadFigures = amp.loadFigures ?? { rms4OhmW: null, rms2OhmW: null, rms1OhmW: null, minLoadOhm: null, bridgeable: bridged, bridgedRmsW: null };
	const options = loadPlan([subs.drivers], { bridged }, figures);
	let chosen: number | null = subs.wiring != null && subs.wiring >= 0 && subs.wiring < options.length ? subs.wiring : null;
	const picked = chosen === null ? 'best' : 'typed';
	if (chosen === null) {
		// The stable wiring with the most rated power; among equals, the higher load (cooler running).
		let best = -1;
		options.forEach((o, i) => {
			if (!o.check?.ok) return;
			const b = best < 0 ? null : options[best];
			const w = o.check.ratedW ?? 0;
			const bw = b?.check?.ratedW ?? 0;
			if (!b || w > bw || (w === bw && o.ohms > b.ohms)) best = i;
		});
		chosen = best < 0 ? null : best;
	}
	if (chosen === null) gaps.push(`Subwoofers: no wiring of these drivers suits ${amp.label}; choose another amplifier or other drivers.`);
	else if (!options[chosen].check?.ok) gaps.push(`Subwoofers: ${options[chosen].check?.message}`);
	return { ampKey: amp.key, ampLabel: amp.label, drivers: subs.drivers, bridged, options, chosen, picked };
}

const perAmp = (value: number | null | undefined | readonly number[], n: number): number[] | null => {
	if (value == null) return null;
	if (typeof value === 'number') return Array.from({ length: n }, () => value);
	if (value.length === 0) return null;
	return Array.from({ length: n }, (_, i) => value[Math.min(i, value.length - 1)]);
};

export function jobSheet(input: JobSheetInput): JobSheet {
	const { content, parts } = input;
	const gaps: string[] = [];
	const assumptions: string[] = [];
	const volts = input.volts ?? NOMINAL_VOLTS;
	const maxDropPct = input.maxDropPct ?? ABYC_E11_CRITICAL_DROP_PCT;
	const material = input.material ?? DEFAULT_MATERIAL;

	const catalogueAmps = parts.flatMap((p): SheetAmplifier[] => {
		if (p.kind !== 'amplifier') return [];
		const efficiency = amplifierEfficiency(p);
		const draw = ampCurrent({ rmsWattsPerChannel: p.rmsWattsPerChannel, channels: p.channels, efficiency, volts });
		const detail = `${p.channels} × ${p.rmsWattsPerChannel} W RMS, efficiency ${Math.round(efficiency * 100)} %${p.fuseRatingA ? `, own fuses ${p.fuseRatingA} A` : ''}`;
		return [{ key: `part-${p.id}`, loadFigures: p, label: p.sku, currentA: draw.currentA, runningCurrentA: draw.runningCurrentA, channels: p.channels, fuseA: p.fuseRatingA, detail, part: p }];
	});
	const typed = (input.typedAmps ?? []).map((t, i) => typedAmplifier(t, i, volts));
	for (const t of typed) if (typeof t === 'string') gaps.push(t);
	const amplifiers = [...catalogueAmps, ...typed.filter((t): t is SheetAmplifier => typeof t !== 'string')];
	const currentA = amplifiers.reduce((sum, a) => sum + a.currentA, 0);
	const unrated = amplifiers.filter((a) => a.fuseA === null).map((a) => a.label);
	if (unrated.length) gaps.push(`No fuse rating for ${unrated.join(', ')}: check the fuse on the amplifier, and never fit a main fuse smaller than it.`);

	const runs = content.power.runs;
	const run = runs.find((r) => r.id === input.powerRunId) ?? runs.find((r) => r.lengthM !== null) ?? runs[0] ?? null;
	const typedPower = input.powerM != null;
	const powerM = typedPower ? input.powerM! : (run?.lengthM ?? null);
	const powerRun = { id: run?.id ?? null, to: run?.to ?? '', lengthM: powerM, typed: typedPower };
	const groundsM = perAmp(input.groundM, amplifiers.length);
	const branchesM = perAmp(input.branchM, amplifiers.length);
	const cores = input.coresPerCable ?? 2;
	const remoteInCable = !!input.remoteInSpeakerCable && cores > 2 && amplifiers.length > 0;

	let distribution: DistributionPlan | null = null;
	let wire: PowerWireResult | null = null;
	let fuse: JobSheet['fuse'] = null;
	const cutList: CutLine[] = [];
	const line = (item: CutLine['item'], label: string, count: number, lengthM: number | null, gauge: string | null, note: string): CutLine => ({
		item,
		label,
		count,
		lengthM,
		cutM: lengthM === null ? null : cutLength(lengthM),
		gauge,
		note
	});

	if (amplifiers.length > 0) {
		if (powerM === null) gaps.push('No power run length: measure the route from the battery to the amplifier, or type it.');
		else {
			distribution = distributionPlan({
				amps: amplifiers.map((a) => ({ label: a.label, currentA: a.currentA, fuseA: a.fuseA })),
				mainLengthM: powerM,
				branchLengthsM: amplifiers.length > 1 ? (branchesM ?? []) : [],
				groundLengthsM: groundsM ?? [],
				material,
				volts,
				maxDropPct,
				headUnitRemoteA: input.headUnitRemoteA ?? null
			});
			assumptions.push(...distribution.assumptions);
			if (distribution.ok) {
				wire = distribution.main;
				fuse = { ...mainFuse(currentA, distribution.main.gauge, distribution.main.basis.ownFuseA, material), withinMm: MAIN_FUSE_MAX_DISTANCE_MM, spot: content.power.fuseHolderSpot };
			} else gaps.push(distribution.reason);
		}
		const plan = distribution?.ok ? distribution : null;
		const mainGauge = plan ? gaugeLabel(plan.main.gauge) : null;
		const single = amplifiers.length === 1;
		cutList.push(line('power', single ? 'Power cable, battery to amplifier' : 'Main power cable, battery to distribution block', 1, powerM, mainGauge, run && !typedPower ? `Page run to ${run.to || 'the amplifier spot'}.` : 'Typed length.'));
		amplifiers.forEach((a, i) => {
			const branch = plan?.branches[i] ?? null;
			if (!single) {
				cutList.push(line('branch', `Branch, block to ${a.label}`, 1, branch?.lengthM ?? branchesM?.[i] ?? null, branch ? gaugeLabel(branch.wire.gauge) : null, branch ? `Fused ${branch.wire.fuseA} A at the block.` : 'Typed length.'));
			}
			const groundGauge = plan ? gaugeLabel(plan.grounds[i].gauge) : null;
			cutList.push(line('ground', single ? 'Ground lead, amplifier to chassis' : `Ground lead, ${a.label} to chassis`, 1, plan?.grounds[i].lengthM ?? groundsM?.[i] ?? DEFAULT_GROUND_M, groundGauge, `Same gauge as its power feed, to bare chassis metal.${groundsM ? '' : ' Length assumed.'}`));
		});
		if (!remoteInCable) {
			const remoteM = input.remoteM ?? null;
			if (remoteM === null) gaps.push('No remote lead length: the page records no remote run, so measure from the head unit to the amplifier and type it.');
			cutList.push(line('remote', 'Remote turn-on lead', 1, remoteM, gaugeLabel(REMOTE_AWG), `Runs from the head unit beside the speaker or signal cables. ${remoteM === null ? 'Not measured: type its length.' : 'Typed length.'}${plan?.remote.relay ? ' Through a relay: see the remote turn-on note.' : ''}`));
		}
	}

	let speakerCable: JobSheet['speakerCable'] = null;
	const speakers = input.speakers ?? amplifiers.reduce((n, a) => n + (a.channels ?? 0), 0);
	if (speakers > 0) {
		const speakerM = input.speakerM ?? null;
		const plan = speakerCablePlan({ speakers, includeRemote: remoteInCable, coresPerCable: cores });
		const speakerPart = parts.find((p): p is Speaker => p.kind === 'speaker' && p.impedanceOhm !== null);
		const impedance = speakerPart?.impedanceOhm ?? NOMINAL_SPEAKER_OHMS;
		const pick = speakerM === null ? null : speakerGauge(speakerM, impedance, material);
		const gauge = pick === null ? null : gaugeLabel(pick.gauge);
		speakerCable = { ...plan, gauge: gauge ?? '—' };
		if (speakerM === null) gaps.push('No speaker run length: the page records no speaker run, so measure one and type it.');
		if (pick && !pick.meets) gaps.push(`No stocked speaker gauge keeps the loss under ${SPEAKER_LOSS_SHARE * 100} % of ${impedance} Ω over ${speakerM} m: even ${gauge} loses more. Shorten the run or use heavier cable.`);
		if (!speakerPart) assumptions.push(`Speakers taken as ${NOMINAL_SPEAKER_OHMS} Ω nominal (common practice); no chosen speaker gives its impedance.`);
		const cable = cores === 2 ? 'pair' : `${cores}-core cable`;
		const loss = pick === null ? '' : pick.meets ? `; gauge keeps loss under ${SPEAKER_LOSS_SHARE * 100} % of ${impedance} Ω` : `; no stocked gauge keeps loss under ${SPEAKER_LOSS_SHARE * 100} % of ${impedance} Ω`;
		cutList.push(
			line('speaker', `Speaker cable (${cable})`, plan.cables, speakerM, gauge, `${speakers} speaker${speakers === 1 ? '' : 's'}, ${plan.conductors} conductors, ${plan.spareCores} spare core${plan.spareCores === 1 ? '' : 's'}${loss}.${speakerM === null ? ' Not measured: type its length.' : ' Typed length.'}${remoteInCable ? ' The remote turn-on lead runs in a spare core.' : ''}`)
		);
	}

	const mounting: Mounting[] = parts.map((part) => {
		const box = partBox(part);
		if (box) {
			const all = seatSpaceFits(content.seats.spaces, box);
			return { part, seat: { chosen: pickSpace(all, input.seat), all } };
		}
		if (part.kind === 'head-unit') return { part, dash: dashFit(part, content.dash) };
		const all = speakerLocationFits(content.speakers.locations, part as Extract<Part, { kind: 'speaker' }>);
		return { part, speaker: { chosen: pickLocation(all, input.speakerLocation), all } };
	});

	const load = sheetLoad(input.subwoofers ?? null, amplifiers, gaps);
	let charging: ChargingBudget | null = null;
	if (amplifiers.length > 0) {
		const { alternatorCruiseA, alternatorIdleA } = content.boot;
		if (alternatorCruiseA === null) gaps.push("Charging budget: the page records no alternator output; measure or look up the alternator's rating and add it to the page.");
		else if (input.vehicleLoadA == null) gaps.push("Charging budget: type the vehicle's own load (lights, fans, engine management) to check it against the alternator.");
		else {
			const alternatorIdle = alternatorIdleA !== null && alternatorIdleA <= alternatorCruiseA ? alternatorIdleA : null;
			try {
				charging = chargingBudget({ alternatorA: alternatorCruiseA, alternatorIdleA: alternatorIdle, vehicleLoadA: input.vehicleLoadA, addedLoadA: currentA, material });
			} catch (e) {
				gaps.push(`Charging budget: ${(e as Error).message}`);
			}
		}
	}

	const typedBoxFits = input.box ? seatSpaceFits(content.seats.spaces, input.box) : null;
	const typedBox = input.box && typedBoxFits ? { box: input.box, seat: { chosen: pickSpace(typedBoxFits, input.seat), all: typedBoxFits } } : null;

	const lines: ControlLine[] = content.harness.ladder.lines
		.map((l) => ({ name: l.name || 'Unnamed line', buttons: l.buttons.flatMap((b) => (b.ohms === null ? [] : [{ name: b.name || 'Unnamed button', ohms: b.ohms }])) }))
		.filter((l) => l.buttons.length > 0);
	const ladder =
		lines.length > 0
			? {
					lines,
					report: ladderReport(lines, DEFAULT_CIRCUIT),
					separator: lines.length === 2 ? suggestSeparator(lines[0], lines[1], DEFAULT_CIRCUIT, 'E24') : null
				}
			: null;

	const basis = distribution?.ok ? distribution.basis : electricalBasis(volts, { maxDropPct, material });
	return { amplifiers, currentA, basis, volts, material, powerRun, distribution, wire, fuse, cutList, speakerCable, mounting, load, charging, typedBox, ladder, cautions: [...WORK_CAUTIONS], gaps, assumptions };
}
