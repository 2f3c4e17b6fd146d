import type { RequestHandler } from './$types';
import { calcPost } from '$lib/server/http';
import { enclosureInputSchema, enclosureVolume } from '$lib/domain/boxVolume';

export const POST: RequestHandler = calcPost(enclosureInputSchema, enclosureVolume);
