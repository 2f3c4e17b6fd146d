import { z } from 'zod';
import { SECTION_KEYS } from '../../domain/content/schema';

/** Filters for recent changes and contributions, read from the URL so they can be shared and bookmarked. */
export const changesFilterSchema = z.object({
	user: z.coerce.number().int().positive('Pick a person from the list.').optional(),
	section: z.enum(SECTION_KEYS, { error: 'Pick a section from the list.' }).optional(),
	unreviewed: z.literal('1', { error: 'Tick the box to show only unreviewed changes.' }).optional(),
	page: z.coerce.number().int().min(1, 'Pages start at 1.').max(100_000).default(1)
});

export function changesFilter(url: URL) {
	const raw = Object.fromEntries([...url.searchParams].filter(([, v]) => v !== ''));
	return changesFilterSchema.safeParse(raw);
}
