import { loadPlan, type LoadRequest, type LoadOption } from '../../domain/coilWiring';
import type { Amplifier } from '../../domain/part';
import { ServiceError } from '../errors';
import { requirePart } from './parts';

/** An amplifier from the catalogue, or a refusal that says what the number is instead. */
export async function requireAmplifier(partId: number): Promise<Amplifier> {
	const part = await requirePart(partId);
	if (part.kind !== 'amplifier') {
		const message = `Part ${partId} (${part.sku}) is a ${part.kind.replace('-', ' ')}, not an amplifier.`;
		throw new ServiceError(message, 400, { partId: message });
	}
	return part;
}

export interface LoadAnswer {
	options: LoadOption[];
	amplifier: { id: number; sku: string; name: string } | null;
}

/** Every wiring of the drivers, checked against a catalogue amplifier when one is named. */
export async function loadAnswer(input: LoadRequest): Promise<LoadAnswer> {
	const amp = input.partId ? await requireAmplifier(input.partId) : null;
	return {
		options: loadPlan(input.drivers, { bridged: input.bridged }, amp),
		amplifier: amp ? { id: amp.id, sku: amp.sku, name: amp.name } : null
	};
}
