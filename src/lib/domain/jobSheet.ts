import type { VehicleContent } from './content/schema';
import { ampCurrent, ABYC_E11_CRITICAL_DROP_PCT, electricalBasis, NOMINAL_VOLTS, powerWire, type PowerWireResult } from './power';
import { FUSE_CAUTIONS, fuseBasis, fuseKind, fuseNeededA, MAIN_FUSE_MAX_DISTANCE_MM, mainFuse, standardFuseAtLeast, wireAmpacityA, type MainFuseResult } from './fuse';
import { awgWire, formatAwg, STOCKED_POWER_GAUGES } from './wire';
import { speakerCablePlan, type SpeakerCablePlan } from './speaker';
import { DEFAULT_CIRCUIT, ladderReport, suggestSeparator, type ControlLine, type LadderReport, type SeparatorResult } from './ladder';
import { amplifierEfficiency, partBox, type Amplifier, type Part, type Speaker } from './part';
import { dashFit, pickLocation, pickSpace, seatSpaceFits, speakerLocationFits, type LocationFit, type SpaceFit } from './fitCheck';
import type { DepthFit } from './fit';

// What an installer takes to the car: lengths to cut, gauge, fuse, where things go, what to
// watch for. Everything here is worked out from the page and the chosen parts.

// A short ground lead to bare chassis metal beside the amplifier (common practice).
export const DEFAULT_GROUND_M = 0.5;
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

export interface JobSheetInput {
	content: VehicleContent;
	parts: readonly Part[];
	/** A power run recorded on the page; its length is the default for the power cable. */
	powerRunId?: string | null;
	/** Lengths in metres typed by the installer; each overrides the page's figure. */
	powerM?: number | null;
	groundM?: number | null;
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
}

export interface CutLine {
	item: 'power' | 'ground' | 'remote' | 'speaker';
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

/** A fused feed from the distribution block to one amplifier, when there is more than one. */
export interface BranchFuse {
	sku: string;
	fuseA: number | null;
	kind: 'blade' | 'bolt-down' | null;
	/** Thinnest stocked gauge whose ampacity covers the branch fuse (a short run from the block). */
	gauge: string | null;
	basis: string;
}

export interface JobSheet {
	amplifiers: { part: Amplifier; currentA: number; runningCurrentA: number; efficiency: number }[];
	currentA: number;
	/** The electrical basis every figure on the sheet was worked on, in words. */
	basis: string;
	volts: number;
	branchFuses: BranchFuse[];
	powerRun: { id: string | null; to: string; lengthM: number | null; typed: boolean };
	wire: PowerWireResult | null;
	fuse: (MainFuseResult & { withinMm: number; spot: string }) | null;
	cutList: CutLine[];
	speakerCable: (SpeakerCablePlan & { gauge: string }) | null;
	mounting: Mounting[];
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
export function speakerGauge(lengthM: number, impedanceOhm: number): { gauge: number; meets: boolean } {
	const limit = SPEAKER_LOSS_SHARE * impedanceOhm;
	for (const g of SPEAKER_GAUGES) {
		if ((awgWire(g).ohmsPerKm * 2 * lengthM) / 1000 <= limit) return { gauge: g, meets: true };
	}
	return { gauge: SPEAKER_GAUGES[SPEAKER_GAUGES.length - 1], meets: false };
}

/** Per-amplifier fuses at the distribution block: the same rule as the main fuse, for each feed. */
function branchFuse(sku: string, drawA: number, ownFuseA: number | null): BranchFuse {
	const fuseA = standardFuseAtLeast(fuseNeededA(drawA, ownFuseA));
	if (fuseA === null) return { sku, fuseA, kind: null, gauge: null, basis: `No standard fuse rating covers ${sku}; feed it on its own.` };
	const gauge = [...STOCKED_POWER_GAUGES].sort((a, b) => b - a).find((g) => wireAmpacityA(g) >= fuseA);
	return { sku, fuseA, kind: fuseKind(fuseA), gauge: gauge === undefined ? null : `${formatAwg(gauge)} AWG`, basis: fuseBasis(drawA, ownFuseA, fuseA) };
}

export function jobSheet(input: JobSheetInput): JobSheet {
	const { content, parts } = input;
	const gaps: string[] = [];
	const assumptions: string[] = [];
	const volts = input.volts ?? NOMINAL_VOLTS;
	const maxDropPct = input.maxDropPct ?? ABYC_E11_CRITICAL_DROP_PCT;

	const amplifiers = parts.flatMap((p): JobSheet['amplifiers'] => {
		if (p.kind !== 'amplifier') return [];
		const draw = ampCurrent({ rmsWattsPerChannel: p.rmsWattsPerChannel, channels: p.channels, efficiency: amplifierEfficiency(p), volts });
		return [{ part: p, efficiency: amplifierEfficiency(p), currentA: draw.currentA, runningCurrentA: draw.runningCurrentA }];
	});
	const currentA = amplifiers.reduce((sum, a) => sum + a.currentA, 0);
	const rated = amplifiers.filter((a) => a.part.fuseRatingA !== null);
	const ownFuseA = rated.length ? rated.reduce((sum, a) => sum + (a.part.fuseRatingA ?? 0), 0) : null;
	const unrated = amplifiers.filter((a) => a.part.fuseRatingA === null).map((a) => a.part.sku);
	if (unrated.length) gaps.push(`No fuse rating in the catalogue for ${unrated.join(', ')}: check the fuse on the amplifier, and never fit a main fuse smaller than it.`);
	const branchFuses = amplifiers.length > 1 ? amplifiers.map((a) => branchFuse(a.part.sku, a.currentA, a.part.fuseRatingA)) : [];

	const runs = content.power.runs;
	const run = runs.find((r) => r.id === input.powerRunId) ?? runs.find((r) => r.lengthM !== null) ?? runs[0] ?? null;
	const typedPower = input.powerM != null;
	const powerM = typedPower ? input.powerM! : (run?.lengthM ?? null);
	const powerRun = { id: run?.id ?? null, to: run?.to ?? '', lengthM: powerM, typed: typedPower };
	const groundM = input.groundM ?? DEFAULT_GROUND_M;
	const remoteM = input.remoteM ?? powerM;
	const assumedSpeakerM = input.speakerM == null && powerM !== null;
	const cores = input.coresPerCable ?? 2;
	const remoteInCable = !!input.remoteInSpeakerCable && cores > 2 && amplifiers.length > 0;

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
			wire = powerWire({ currentA, powerLengthM: powerM, groundLengthM: groundM, volts, maxDropPct, ownFuseA });
			if (wire.ok) {
				fuse = { ...mainFuse(currentA, wire.gauge, ownFuseA), withinMm: MAIN_FUSE_MAX_DISTANCE_MM, spot: content.power.fuseHolderSpot };
			} else gaps.push(wire.reason);
		}
		if (input.groundM == null) assumptions.push(`Ground lead taken as ${DEFAULT_GROUND_M} m, a short lead to bare chassis metal beside the amplifier (common practice); measure it and type it if longer.`);
		if (input.remoteM == null && powerM !== null && !remoteInCable) assumptions.push('Remote lead taken as long as the power run.');
		const gauge = wire?.ok ? `${wire.awg} AWG` : null;
		cutList.push(line('power', 'Power cable, battery to amplifier', 1, powerM, gauge, run && !typedPower ? `Page run to ${run.to || 'the amplifier spot'}.` : 'Typed length.'));
		cutList.push(line('ground', 'Ground lead, amplifier to chassis', 1, groundM, gauge, `Same gauge as the power cable, to bare chassis metal.${input.groundM == null ? ' Length assumed.' : ''}`));
		if (!remoteInCable) cutList.push(line('remote', 'Remote turn-on lead', 1, remoteM, `${formatAwg(REMOTE_AWG)} AWG`, `Runs from the head unit beside the speaker or signal cables.${input.remoteM == null && powerM !== null ? ' Length assumed: as long as the power run.' : ''}`));
	}

	let speakerCable: JobSheet['speakerCable'] = null;
	const speakers = input.speakers ?? amplifiers.reduce((n, a) => n + a.part.channels, 0);
	if (speakers > 0) {
		const speakerM = input.speakerM ?? powerM;
		const plan = speakerCablePlan({ speakers, includeRemote: remoteInCable, coresPerCable: cores });
		const speakerPart = parts.find((p): p is Speaker => p.kind === 'speaker' && p.impedanceOhm !== null);
		const impedance = speakerPart?.impedanceOhm ?? NOMINAL_SPEAKER_OHMS;
		const pick = speakerM === null ? null : speakerGauge(speakerM, impedance);
		const gauge = pick === null ? null : `${formatAwg(pick.gauge)} AWG`;
		speakerCable = { ...plan, gauge: gauge ?? '—' };
		if (speakerM === null) gaps.push('No speaker run length: measure one run, or type it.');
		if (pick && !pick.meets) gaps.push(`No stocked speaker gauge keeps the loss under ${SPEAKER_LOSS_SHARE * 100} % of ${impedance} Ω over ${speakerM} m: even ${gauge} loses more. Shorten the run or use heavier cable.`);
		if (assumedSpeakerM) assumptions.push('Each speaker run taken as long as the power run; measure one and type it.');
		if (!speakerPart) assumptions.push(`Speakers taken as ${NOMINAL_SPEAKER_OHMS} Ω nominal (common practice); no chosen speaker gives its impedance.`);
		const cable = cores === 2 ? 'pair' : `${cores}-core cable`;
		const loss = pick === null ? '' : pick.meets ? `; gauge keeps loss under ${SPEAKER_LOSS_SHARE * 100} % of ${impedance} Ω` : `; no stocked gauge keeps loss under ${SPEAKER_LOSS_SHARE * 100} % of ${impedance} Ω`;
		cutList.push(
			line('speaker', `Speaker cable (${cable})`, plan.cables, speakerM, gauge, `${speakers} speaker${speakers === 1 ? '' : 's'}, ${plan.conductors} conductors, ${plan.spareCores} spare core${plan.spareCores === 1 ? '' : 's'}${loss}.${assumedSpeakerM ? ' Length assumed: as long as the power run.' : ''}${remoteInCable ? ' The remote turn-on lead runs in a spare core.' : ''}`)
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

	const basis = electricalBasis(volts, { maxDropPct, tempC: wire?.basis.tempC });
	return { amplifiers, currentA, basis, volts, branchFuses, powerRun, wire, fuse, cutList, speakerCable, mounting, ladder, cautions: [...WORK_CAUTIONS], gaps, assumptions };
}
