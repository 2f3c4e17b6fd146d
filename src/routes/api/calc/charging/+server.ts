import type { RequestHandler } from './$types';
import { calcPost } from '$lib/server/http';
import { CHARGING_CAUTIONS, chargingBudget, chargingInputSchema } from '$lib/domain/charging';

export const POST: RequestHandler = calcPost(chargingInputSchema, (input) => ({ ...chargingBudget(input), cautions: CHARGING_CAUTIONS }));
