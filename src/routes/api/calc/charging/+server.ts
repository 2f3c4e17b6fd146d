import type { RequestHandler } from './$types';
import { calcPost } from '$lib/server/http';
import { CHARGING_CAUTIONS, chargingBudget } from '$lib/domain/charging';
import { chargingInputSchema } from '$lib/domain/calcSchemas';

export const POST: RequestHandler = calcPost(chargingInputSchema, (input) => ({ ...chargingBudget(input), cautions: CHARGING_CAUTIONS }));
