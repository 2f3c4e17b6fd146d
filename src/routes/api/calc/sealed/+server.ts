import type { RequestHandler } from './$types';
import { calcPost } from '$lib/server/http';
import { sealedBox, sealedInputSchema } from '$lib/domain/sealedBox';

export const POST: RequestHandler = calcPost(sealedInputSchema, sealedBox);
