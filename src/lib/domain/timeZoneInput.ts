import { z } from 'zod';
import { knownTimeZones } from './shopTime';

/** The shop's time zone as a setting form posts it. */
export const timeZoneSchema = z
	.string({ error: 'Pick the shop’s time zone from the list.' })
	.trim()
	.min(1, 'Pick the shop’s time zone from the list.')
	.refine((zone) => knownTimeZones().includes(zone), { error: 'That is not a time zone this server knows: pick one from the list, for example Europe/Berlin or America/Chicago.' });
