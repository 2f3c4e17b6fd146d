import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { renderMarkdown } from '$lib/server/markdown';

const NOTES_MAX = 20_000;

const previewSchema = z.object({
	text: z
		.string({ error: 'Send the notes as text.' })
		.max(NOTES_MAX, { error: `Notes are too long to preview: keep them under ${NOTES_MAX} characters.` })
});

/** The editor's live preview: the same rendering a saved page gets. */
export const POST: RequestHandler = async ({ locals, request }) => {
	requireRole(locals, 'editor');
	const body = await request.json().catch(() => null);
	const parsed = previewSchema.safeParse(body);
	if (!parsed.success) error(400, parsed.error.issues[0].message);
	return json({ html: renderMarkdown(parsed.data.text) });
};
