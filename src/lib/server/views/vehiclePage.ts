import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { requireRole } from '../auth/guard';
import { vehicleBySlug } from '../services/vehicles';
import { readableHead } from '../services/renderedPages';
import { isWatching } from '../services/watch';
import { trustSummaryFromMarks } from '../services/trust';
import { canEditVehicle } from '../services/revisions';
import { deliverBody } from '../render/vehicleBody';
import { partsFor, readingPage } from '../render/readingPage';
import { listSuggestions } from '../services/suggestions';

type VehiclePageEvent = Pick<RequestEvent<{ slug: string }>, 'locals' | 'params' | 'url' | 'isDataRequest'>;

/**
 * Everything the reading view of a vehicle page shows, for the signed-in reader. What does not depend on
 * the reader comes stored with the page's row (see render/readingPage.ts); the rest is who reads, whether
 * they follow the page, and its trust marks.
 */
export async function vehiclePageData({ locals, params, url, isDataRequest }: VehiclePageEvent) {
	const user = requireRole(locals, 'viewer');
	const page = await readingPage(params.slug, locals.units);
	if (!page) {
		const moved = await vehicleBySlug(params.slug);
		if (moved && 'redirectTo' in moved) redirect(301, `/vehicles/${moved.redirectTo}`);
		error(404, 'No vehicle page at this address.');
	}
	const { vehicle } = page;
	const [{ revision, newerAwaitingReview }, watching, suggestions] = await Promise.all([
		readableHead(page, user),
		isWatching(user.id, vehicle.id),
		listSuggestions(user, { vehicleId: vehicle.id, status: 'open' })
	]);
	const parts = revision && (revision.id === page.latest?.id ? page.parts : await partsFor(revision, locals.units));
	if (!revision || !parts) {
		error(404, newerAwaitingReview ? 'This new page is awaiting sign-off by a moderator.' : 'This vehicle page has no saved revision yet.');
	}
	const trust = await trustSummaryFromMarks(vehicle.id, revision.id, locals.units, page.marks);
	const saved = Number(url.searchParams.get('saved'));
	return {
		vehicle,
		identity: parts.identity,
		photos: parts.photos,
		// A full page view gets the stored figures and notes spliced into its HTML (see hooks.server.ts) instead of
		// serialising them twice; a client-side navigation receives them as data.
		...deliverBody(locals, parts, isDataRequest),
		revision: { id: revision.id, authorName: revision.authorName, createdAt: revision.createdAt.toISOString(), summary: revision.summary },
		canEdit: canEditVehicle(user, vehicle),
		watching,
		trust,
		newerAwaitingReview,
		// A rename waiting for sign-off: lists, search and the address keep the signed-off name until then.
		listedAs: parts.slug === vehicle.slug ? null : vehicle.title,
		suggestions,
		units: locals.units,
		flash: Number.isInteger(saved) && saved > 0 ? { revisionId: saved, merged: url.searchParams.get('merged') === '1' } : null
	};
}
