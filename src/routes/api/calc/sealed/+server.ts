import type { RequestHandler } from './$types';
import { calcPost } from '$lib/server/http';
import { sealedBox } from '$lib/domain/sealedBox';
import { sealedInputSchema } from '$lib/domain/calcSchemas';

export const POST: RequestHandler = calcPost(sealedInputSchema, sealedBox);
