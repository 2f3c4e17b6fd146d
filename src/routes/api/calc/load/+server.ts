import type { RequestHandler } from './$types';
import { calcPost } from '$lib/server/http';
import { loadInputSchema } from '$lib/domain/calcSchemas';
import { loadAnswer } from '$lib/server/services/ampLoad';

export const POST: RequestHandler = calcPost(loadInputSchema, loadAnswer);
