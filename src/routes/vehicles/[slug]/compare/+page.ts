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
	// Two ticked rows of the history list, or its older and newer pickers; either way the older comes first.
	const ticked = url.searchParams.getAll('pick');
	const pair = ticked.length === 2 ? ticked : [url.searchParams.get('from'), url.searchParams.get('to')];
	if (ticked.length > 2 || !pair[0] || !pair[1]) error(400, 'Tick two revisions on the history page (or pick an older and a newer one) to see what changed.');
	const [from, to] = Number(pair[0]) > Number(pair[1]) ? [pair[1], pair[0]] : [pair[0], pair[1]];
	const res = await fetch(`/api/vehicles/${params.slug}/compare?from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}`);
	const body = await res.json();
	if (!res.ok) error(res.status, body.message);
	return { slug: params.slug, comparison: body as CompareResponse };
};
