import { bootSpaceOf, checkedEnclosureFit, enclosureFit, enclosureFitReason, loadOpeningOf, type EnclosureBox, type EnclosureFit } from '../../domain/bootFit';
import { enclosureAgainstPageSchema, enclosureBoxSchema, type EnclosureAgainstPage } from '../../domain/bootFitRequest';
import { reverseOptionsSchema, type ReverseOptions } from '../../domain/fitRequest';
import { DEFAULT_CLEARANCE_MM, DEFAULT_TIGHT_MM } from '../../domain/sizeRules';
import type { FitVerdict } from '../../domain/fit';
import type { UnitSystem } from '../../domain/units';
import type { Part } from '../../domain/part';
import { requireVehicle } from './vehicles';
import { pageRevision } from './visibility';
import type { Reader } from '../../domain/visibility';
import { requirePart } from './parts';
import { seatSpaceIndex } from '../fit';
import { ServiceError } from '../errors';

// An enclosure into a vehicle's boot: one page, and the reverse — every page whose boot takes it.

const refuse = (message: string, field = 'form'): never => {
	throw new ServiceError(message, 400, { [field]: message });
};

/** A catalogue part's box for the boot check: enclosures and amplifiers have one. */
export function partEnclosure(part: Part): EnclosureBox {
	if (part.kind !== 'enclosure' && part.kind !== 'amplifier') refuse(`A ${part.kind} is not checked against the boot; pick an enclosure or an amplifier.`, 'partId');
	const p = part as Extract<Part, { kind: 'enclosure' | 'amplifier' }>;
	return { l: p.lengthMm, w: p.widthMm, h: p.heightMm };
}

export type BootFitAnswer = {
	vehicle: { slug: string; title: string };
	revisionId: number;
	box: EnclosureBox;
	part: { id: number; sku: string; name: string } | null;
	fit: EnclosureFit;
	reason: string;
};

/** A catalogue enclosure or a typed box against one page's boot as it stands now. */
export async function checkBootFit(request: EnclosureAgainstPage, reader: Reader, units: UnitSystem = 'metric'): Promise<BootFitAnswer> {
	const parsed = enclosureAgainstPageSchema.safeParse(request);
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		refuse(issue.message, String(issue.path.join('.') || 'form'));
	}
	const input = parsed.data!;
	const vehicle = await requireVehicle(input.vehicle);
	const { revision: rev } = await pageRevision(vehicle, reader);
	if (!rev) throw new ServiceError('This page has no revision yet.', 404);
	const part = input.partId !== undefined ? await requirePart(input.partId) : null;
	const box = part ? partEnclosure(part) : input.box!;
	const fit = enclosureFit(box, bootSpaceOf(rev.content.boot), loadOpeningOf(rev.content.boot), { clearanceMm: input.marginMm, tightMm: input.tightMm });
	return {
		vehicle: { slug: vehicle.slug, title: vehicle.title },
		revisionId: rev.id,
		box,
		part: part ? { id: part.id, sku: part.sku, name: part.name } : null,
		fit,
		reason: enclosureFitReason(fit, units)
	};
}

export type BootReverseRow = {
	vehicleSlug: string;
	vehicleTitle: string;
	revisionId: number;
	verdict: FitVerdict;
	rotated: boolean;
	margins: EnclosureFit['margins'];
	opening: EnclosureFit['opening'];
	limiting: EnclosureFit['limiting'];
};

export type BootReverseAnswer = {
	check: 'boot';
	clearanceMm: number;
	matches: BootReverseRow[];
	notMeasured: { vehicleSlug: string; vehicleTitle: string }[];
	searched: { vehicles: number };
};

/** "Which vehicles take this box in the boot": every page's latest boot, from the same index the seat scan reads. */
export async function vehiclesForBootBox(box: EnclosureBox, options: ReverseOptions = {}): Promise<BootReverseAnswer> {
	const opts = reverseOptionsSchema.safeParse(options);
	if (!opts.success) refuse(opts.error!.issues[0].message, 'clearanceMm');
	const b = enclosureBoxSchema.safeParse(box);
	if (!b.success) refuse(b.error!.issues[0].message, 'box');
	const clearanceMm = opts.data?.clearanceMm ?? DEFAULT_CLEARANCE_MM;
	const tightMm = opts.data?.tightMm ?? DEFAULT_TIGHT_MM;
	const { vehicles, boots } = await seatSpaceIndex();
	const found = boots.query(b.data!, clearanceMm, tightMm);
	const matches: BootReverseRow[] = [];
	found.rows.forEach((row) => {
		const v = vehicles[row];
		// The index found it; the page's own figures give the margins.
		const r = checkedEnclosureFit(b.data!, v.boot.space, v.boot.opening, clearanceMm, tightMm);
		matches.push({ vehicleSlug: v.slug, vehicleTitle: v.title, revisionId: v.revisionId, verdict: r.verdict, rotated: r.rotated, margins: r.margins, opening: r.opening, limiting: r.limiting });
	});
	const notMeasured: BootReverseAnswer['notMeasured'] = [];
	for (let row = 0; row < boots.size; row++) {
		const { space, opening } = vehicles[row].boot;
		// Only a boot with a gap can be unanswered; the full check says whether a measured side already rules it out.
		const gap = [space.l ?? space.lTop, space.w ?? space.archW, space.h, opening.w, opening.h].includes(null);
		if (gap && checkedEnclosureFit(b.data!, space, opening, clearanceMm, tightMm).verdict === 'not-measured') {
			notMeasured.push({ vehicleSlug: vehicles[row].slug, vehicleTitle: vehicles[row].title });
		}
	}
	// The index keeps its vehicles in title order already.
	return { check: 'boot', clearanceMm, matches, notMeasured, searched: { vehicles: vehicles.length } };
}

/** The reverse question for a catalogue part. */
export async function vehiclesForBootPart(partId: number, options: ReverseOptions = {}): Promise<BootReverseAnswer> {
	return vehiclesForBootBox(partEnclosure(await requirePart(partId)), options);
}
