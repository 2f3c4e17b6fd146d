import { z } from 'zod';
import { AMP_CURRENT_INPUT, CABLE_MATERIAL_WORDS, POWER_WIRE_INPUT } from './power';
import { schemaOf } from './ruleSchema';
import { CABLE_MATERIALS, DEFAULT_MATERIAL } from './wire';

// The wire calculators' figures as the endpoints and the install forms read them, in the calculators' words.

export const materialSchema = z.enum(CABLE_MATERIALS, { error: CABLE_MATERIAL_WORDS }).default(DEFAULT_MATERIAL);
export const ampCurrentInputSchema = schemaOf(AMP_CURRENT_INPUT);
export const powerWireInputSchema = schemaOf(POWER_WIRE_INPUT);
