import { ENCLOSURE_INPUT } from './boxVolume';
import { CHARGING_INPUT } from './charging';
import { LOAD_INPUT } from './coilWiring';
import { DISTRIBUTION_INPUT } from './distribution';
import { schemaOf } from './ruleSchema';
import { SEALED_INPUT } from './sealedBox';

// The calculators' endpoints read their bodies with the calculators' own rules.

export const enclosureInputSchema = schemaOf(ENCLOSURE_INPUT);
export const sealedInputSchema = schemaOf(SEALED_INPUT);
export const loadInputSchema = schemaOf(LOAD_INPUT);
export const chargingInputSchema = schemaOf(CHARGING_INPUT);
export const distributionInputSchema = schemaOf(DISTRIBUTION_INPUT);
