import { page } from '$app/state';
import { formatDay as dayIn, formatWhen as whenIn } from './domain/shopTime';

/** The shop's time zone, from the layout's data every page carries (UTC outside a page, e.g. in a script). */
export function shopZone(): string {
	try {
		return (page.data as { shop?: { timeZone?: string } } | undefined)?.shop?.timeZone ?? 'UTC';
	} catch {
		return 'UTC';
	}
}

/** The date and time shown everywhere (history, the shop log, pages, the job sheet), in the shop's zone. */
export const formatWhen = (at: string | Date, zone = shopZone()): string => whenIn(at, zone);

/** The day alone, in the shop's zone. */
export const formatDay = (at: string | Date, zone = shopZone()): string => dayIn(at, zone);
