import type { VehicleContent } from './content/schema';
import { SECTION_KEYS, type SectionKey } from './content/vocabulary';

// Which revision last changed each part of a page. A part is a section ("section:seats") or a place
// the trade measures: "dash", "boot", "seat:<id>", "speaker:<id>", "passage:<id>", "run:<id>", "ground:<id>".

export const sectionPart = (section: SectionKey): string => `section:${section}`;

/**
 * The figures of every place on a page, by part key. A place counts as changed when these change;
 * its wording (obstacles, grille notes, things to avoid) belongs to its section instead.
 */
export function placeFigures(content: VehicleContent): Record<string, readonly unknown[]> {
	const d = content.dash;
	// The measured opening joins the dash's figures only once recorded, so earlier revisions keep their digests.
	const opened = d.openingWidthMm !== null || d.openingHeightMm !== null ? [d.openingWidthMm, d.openingHeightMm] : [];
	const out: Record<string, readonly unknown[]> = { dash: [d.opening, d.depthMm, ...opened] };
	const b = content.boot;
	const boot = [b.floorLengthMm, b.depthTopMm, b.floorWidthMm, b.archWidthMm, b.heightMm, b.openingWidthMm, b.openingHeightMm, b.lipHeightMm];
	// The boot is a place once something of it is measured, so pages without one keep their digests.
	if (boot.some((v) => v !== null)) out.boot = boot;
	for (const s of content.seats.spaces) out[`seat:${s.id}`] = [s.seat, s.lengthMm, s.widthMm, s.heightMm];
	for (const l of content.speakers.locations) out[`speaker:${l.id}`] = [l.cutoutMm, l.depthMm];
	for (const p of content.firewall.passages) out[`passage:${p.id}`] = [p.location, p.kind, p.pushFrom, p.holeMm];
	for (const r of content.power.runs) out[`run:${r.id}`] = [r.to, r.lengthM];
	for (const g of content.power.groundPoints) out[`ground:${g.id}`] = [g.location];
	return out;
}

/** One part of one revision: the revision that last changed it, and (for a place) a digest of its figures. */
export type OriginRow = { part: string; originRevisionId: number; digest: string | null };

/**
 * The rows of a new revision. A section is changed when the revision's list of changed sections names it;
 * a place when its figures' digest differs from the parent's. Anything unchanged keeps the parent's origin;
 * a part the parent lacked starts here.
 */
export function deriveOrigins(
	revisionId: number,
	parent: readonly OriginRow[] | null,
	changedSections: readonly SectionKey[],
	placeDigests: Readonly<Record<string, string>>
): OriginRow[] {
	const before = new Map((parent ?? []).map((r) => [r.part, r]));
	const changed = new Set(changedSections);
	const rows: OriginRow[] = [];
	for (const section of SECTION_KEYS) {
		const part = sectionPart(section);
		const prev = before.get(part);
		rows.push({ part, originRevisionId: prev && !changed.has(section) ? prev.originRevisionId : revisionId, digest: null });
	}
	for (const [part, digest] of Object.entries(placeDigests)) {
		const prev = before.get(part);
		rows.push({ part, originRevisionId: prev && prev.digest === digest ? prev.originRevisionId : revisionId, digest });
	}
	return rows;
}
