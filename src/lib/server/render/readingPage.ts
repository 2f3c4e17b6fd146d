// A vehicle page's reader-independent parts (body, outline, the header's names and photos) are rendered
// once per content and unit system, when a revision is written or else on the first view, and stored in
// MariaDB, so every reader and every app server shares them. A view reads its page, newest revision and
// parts in one query.
import { dev, version } from '$app/environment';
import type { SectionKey, VehicleContent } from '../../domain/content/schema';
import type { UnitSystem } from '../../domain/units';
import { vehicleSlug } from '../../domain/slug';
import { SHARED_STATE_TTL_MS, lookupCache } from '../cache';
import { onMarksChanged, onRevisionWritten, onVehicleChanged } from '../events';
import { revisionById } from '../services/revisions';
import {
	currentRevisionsMissingParts,
	keptUnits,
	forgetOtherBuilds,
	pageForReading,
	storedParts,
	storeParts,
	type PageForReading,
	type RevisionHead
} from '../services/renderedPages';
import { renderBody } from './vehicleBody';
import { packParts, unpackParts, type ReadingParts, type StoredParts } from './storedParts';

/**
 * Which build rendered the stored parts: a new build renders every page again on its first view, so a
 * change to a component never shows old markup. In development each reload of this module counts as new.
 */
export const RENDERER = dev ? `dev-${Date.now()}` : version;

const UNIT_SYSTEMS: readonly UnitSystem[] = ['metric', 'imperial'];

/** Names one content's parts in one unit system from this renderer. */
const partsTag = (sha256: string, units: UnitSystem) => `${sha256.slice(0, 24)}.${units}.${RENDERER}`;

export function partsOf(revision: { content: VehicleContent; rendered: Partial<Record<SectionKey, string>> }, units: UnitSystem): ReadingParts {
	const { notes: _notes, ...identity } = revision.content.identity;
	return { ...renderBody(revision, units), identity, photos: revision.content.photos, slug: vehicleSlug(identity) };
}

/** Renders and stores a revision's parts in `units`; what it stored is what it returns. */
async function renderAndStore(revisionId: number, units: UnitSystem): Promise<StoredParts | null> {
	const revision = await revisionById(revisionId);
	if (!revision) return null;
	const packed = packParts(partsOf(revision, units));
	await storeParts(revision.sha256, RENDERER, { [units]: packed });
	return unpackParts(Buffer.from(packed), partsTag(revision.sha256, units));
}

/** The stored parts of a revision, rendered and stored first when missing. */
export async function partsFor(revision: RevisionHead, units: UnitSystem): Promise<StoredParts | null> {
	const stored = await storedParts(revision.sha256, units, RENDERER);
	return stored ? unpackParts(stored, partsTag(revision.sha256, units)) : renderAndStore(revision.id, units);
}

/** A page as the reading view finds it, with its newest revision's parts in one unit system. */
export type ReadingPage = Omit<PageForReading, 'parts'> & { parts: StoredParts | null };

// Concurrent views of one page share the query; this process's saves, hides and sign-offs clear it at once,
// another server's within the shared-state time limit, as for every page row. The parts are never changed.
const pages = lookupCache<string, ReadingPage | null>(SHARED_STATE_TTL_MS, 500);
onRevisionWritten(() => pages.clear());
onVehicleChanged(() => pages.clear());
// The page comes with its trust marks.
onMarksChanged(() => pages.clear());

/** A page, its newest revision and that revision's parts in the reader's units (rendered and stored when missing). */
export function readingPage(slug: string, units: UnitSystem): Promise<ReadingPage | null> {
	return pages.get(`${units}|${slug}`, async () => {
		const page = await pageForReading(slug, units, RENDERER);
		if (!page) return null;
		if (page.parts !== null && page.latest) return { ...page, parts: unpackParts(page.parts, partsTag(page.latest.sha256, units)) };
		return { ...page, parts: page.latest && (await renderAndStore(page.latest.id, units)) };
	});
}

/** Renders and stores whatever unit system of a revision's parts is not kept yet. */
async function renderMissing(revisionId: number, kept?: UnitSystem[]): Promise<void> {
	const revision = await revisionById(revisionId);
	if (!revision) return;
	const have = kept ?? (await keptUnits(revision.sha256, RENDERER));
	const missing = UNIT_SYSTEMS.filter((u) => !have.includes(u));
	await storeParts(revision.sha256, RENDERER, Object.fromEntries(missing.map((u) => [u, packParts(partsOf(revision, u))])));
}

// A new revision's parts are rendered as it is written, in both unit systems, so no reader waits for them.
onRevisionWritten(async ({ kind, revisionId }) => {
	if (kind === 'save' || kind === 'create' || kind === 'restore') await renderMissing(revisionId);
});

const BATCH = 100;
// How long parts stored by another build stay: long enough for a rolling restart of every app server.
export const OTHER_BUILDS_KEPT_MS = 24 * 60 * 60 * 1000;

/**
 * After a new build every page's parts are rendered again: this goes through the current revision of each
 * page in the background, one at a time between requests, so readers seldom meet a page not yet rendered.
 * Resolves with how many revisions it rendered.
 */
export async function renderMissingParts(): Promise<number> {
	let rendered = 0;
	for (let after = 0; ; ) {
		const batch = await currentRevisionsMissingParts(RENDERER, after, BATCH);
		for (const { vehicleId, revisionId, kept } of batch) {
			await renderMissing(revisionId, kept);
			rendered++;
			after = vehicleId;
			await new Promise((resolve) => setImmediate(resolve));
		}
		if (batch.length < BATCH) break;
	}
	await forgetOtherBuilds(RENDERER, new Date(Date.now() - OTHER_BUILDS_KEPT_MS));
	return rendered;
}
