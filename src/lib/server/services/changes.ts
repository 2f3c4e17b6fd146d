import { z } from 'zod';
import { SECTION_KEYS } from '../../domain/content/schema';

/** Filters for the shop log and a person's work, read from the URL so they can be shared and bookmarked. */
export const changesFilterSchema = z.object({
	user: z.coerce.number().int().positive('Pick a person from the list.').optional(),
	section: z.enum(SECTION_KEYS, { error: 'Pick a section from the list.' }).optional(),
	awaiting: z.literal('1', { error: 'Tick the box to show only changes awaiting sign-off.' }).optional(),
	page: z.coerce.number().int().min(1, 'Pages start at 1.').max(100_000).default(1)
});

export function changesFilter(url: URL) {
	const raw: Record<string, string> = Object.fromEntries([...url.searchParams].filter(([, v]) => v !== ''));
	// Links made before the filter took its name.
	if (raw.unreviewed && !raw.awaiting) raw.awaiting = raw.unreviewed;
	return changesFilterSchema.safeParse(raw);
}
