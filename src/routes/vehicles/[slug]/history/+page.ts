import { error } from '@sveltejs/kit';
import type { PageLoad } from './$types';
import type { RevisionRow } from '$lib/components/history/revisionRow';
import { vehicleTitle } from '$lib/domain/slug';

// Loaded through the JSON API, on the server for the first view and in the browser after that.
export const load: PageLoad = async ({ fetch, params, url }) => {
	const page = url.searchParams.get('page') ?? '1';
	const [vehicleRes, revisionsRes] = await Promise.all([
		fetch(`/api/vehicles/${params.slug}`),
		fetch(`/api/vehicles/${params.slug}/revisions?page=${encodeURIComponent(page)}`)
	]);
	if (!vehicleRes.ok) error(vehicleRes.status, (await vehicleRes.json()).message);
	if (!revisionsRes.ok) error(revisionsRes.status, (await revisionsRes.json()).message);
	const vehicle = await vehicleRes.json();
	const revisions: { items: RevisionRow[]; total: number; page: number; pageSize: number } = await revisionsRes.json();
	return {
		vehicle: {
			slug: vehicle.slug as string,
			title: vehicleTitle(vehicle),
			protection: vehicle.protection as 'none' | 'moderators',
			revisionId: vehicle.revisionId as number
		},
		revisions
	};
};
