import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { requireRole } from '../auth/guard';
import { vehicleBySlug } from '../services/vehicles';
import { pageRevision } from '../services/visibility';
import { isWatching } from '../services/watch';
import { trustSummary } from '../services/trust';
import { canEditVehicle } from '../services/revisions';
import { listSuggestions } from '../services/suggestions';
import { deliverBody, vehicleBody } from '../render/vehicleBody';

type VehiclePageEvent = Pick<RequestEvent<{ slug: string }>, 'locals' | 'params' | 'url' | 'isDataRequest'>;

/** Everything the reading view of a vehicle page shows, for the signed-in reader. */
export async function vehiclePageData({ locals, params, url, isDataRequest }: VehiclePageEvent) {
	const user = requireRole(locals, 'viewer');
	const found = await vehicleBySlug(params.slug);
	if (!found) error(404, 'No vehicle page at this address.');
	if ('redirectTo' in found) redirect(301, `/vehicles/${found.redirectTo}`);
	const { vehicle } = found;
	const [{ revision, newerAwaitingReview }, watching, trust, suggestions] = await Promise.all([
		pageRevision(vehicle, user),
		isWatching(user.id, vehicle.id),
		trustSummary(vehicle, locals.units),
		listSuggestions(user, { vehicleId: vehicle.id, status: 'open' })
	]);
	if (!revision) {
		error(404, newerAwaitingReview ? 'This new page is awaiting sign-off by a moderator.' : 'This vehicle page has no saved revision yet.');
	}
	const saved = Number(url.searchParams.get('saved'));
	// The identity notes are in the cached fragments; the header needs only the names and years.
	const { notes: _notes, ...identity } = revision.content.identity;
	return {
		vehicle,
		identity,
		photos: revision.content.photos,
		// A full page view gets the cached figures and notes spliced into its HTML (see hooks.server.ts) instead of
		// serialising them twice; a client-side navigation receives them as data.
		...deliverBody(locals, vehicleBody(revision, locals.units), isDataRequest),
		revision: { id: revision.id, authorName: revision.authorName, createdAt: revision.createdAt.toISOString(), summary: revision.summary },
		canEdit: canEditVehicle(user, vehicle),
		watching,
		trust,
		newerAwaitingReview,
		suggestions,
		units: locals.units,
		flash: Number.isInteger(saved) && saved > 0 ? { revisionId: saved, merged: url.searchParams.get('merged') === '1' } : null
	};
}
