import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { isPhotoId, openRendition, photoVisibleTo } from '$lib/server/services/photos';
import { RENDITIONS, RENDITION_TYPE, type Rendition } from '$lib/server/storage/renditions';

// The bytes behind an id never change, so a browser may keep them for a year without asking again.
const CACHE = 'private, max-age=31536000, immutable';

export const GET: RequestHandler = async ({ locals, params, request }) => {
	const user = requireRole(locals, 'viewer');
	const rendition = params.rendition as Rendition;
	if (!isPhotoId(params.id) || !RENDITIONS.includes(rendition)) error(404, 'No photo at this address.');
	if (!(await photoVisibleTo(params.id, user))) error(404, 'No photo at this address.');
	const etag = `"${params.id}"`;
	const headers = { 'Cache-Control': CACHE, ETag: etag, 'X-Content-Type-Options': 'nosniff' };
	const known = request.headers.get('if-none-match');
	if (known && known.split(',').some((t) => t.trim().replace(/^W\//, '') === etag)) return new Response(null, { status: 304, headers });
	const found = await openRendition(params.id, rendition);
	if (!found) error(404, 'No photo at this address.');
	return new Response(found.body, {
		headers: { ...headers, 'Content-Type': RENDITION_TYPE, 'Content-Length': String(found.bytes) }
	});
};
