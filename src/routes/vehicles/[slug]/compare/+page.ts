import { error } from '@sveltejs/kit';
import type { PageLoad } from './$types';

type Side = { id: number; author: string; createdAt: string; summary: string };
export type CompareResponse = {
	from: Side;
	to: Side;
	changes: { path: string; label: string; section: string; kind: 'changed' | 'added' | 'removed'; before: string | null; after: string | null }[];
	notes: { section: string; label: string; parts: { value: string; added?: true; removed?: true }[] }[];
	photos: { added: { id: string; caption: string; alt: string }[]; removed: { id: string; caption: string; alt: string }[] };
};

export const load: PageLoad = async ({ fetch, params, url }) => {
	const from = url.searchParams.get('from');
	const to = url.searchParams.get('to');
	if (!from || !to) error(400, 'Pick two revisions to compare from the history page.');
	const res = await fetch(`/api/vehicles/${params.slug}/compare?from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}`);
	const body = await res.json();
	if (!res.ok) error(res.status, body.message);
	return { slug: params.slug, comparison: body as CompareResponse };
};
