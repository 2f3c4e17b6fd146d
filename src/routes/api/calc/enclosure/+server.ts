import type { RequestHandler } from './$types';
import { calcPost } from '$lib/server/http';
import { enclosureVolume } from '$lib/domain/boxVolume';
import { enclosureInputSchema } from '$lib/domain/calcSchemas';

export const POST: RequestHandler = calcPost(enclosureInputSchema, enclosureVolume);
