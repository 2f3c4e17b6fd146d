import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { renderMarkdown } from '$lib/server/markdown';
import { apiCall, readJson } from '$lib/server/http';

const NOTES_MAX = 20_000;

const previewSchema = z.object({
	text: z
		.string({ error: 'Send the notes as text.' })
		.max(NOTES_MAX, { error: `Notes are too long to preview: keep them under ${NOTES_MAX} characters.` })
});

/** The editor's live preview: the same rendering a saved page gets. */
export const POST: RequestHandler = ({ locals, request }) =>
	apiCall(async () => {
		requireRole(locals, 'editor');
		const { text } = await readJson(request, previewSchema);
		return json({ html: renderMarkdown(text) });
	});
