import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { createPart } from '../../src/lib/server/services/parts';
import { loadAnswer } from '../../src/lib/server/services/ampLoad';
import { loadInputSchema } from '../../src/lib/domain/calcSchemas';
import { ServiceError } from '../../src/lib/server/errors';

// Invented catalogue figures (sample data), not real products.
let ampId: number;
let speakerId: number;

beforeAll(async () => {
	await freshDatabase('amp_load');
	const moderator = await makeUser('moderator');
	const base = { lengthMm: 300, widthMm: 200, heightMm: 60, channels: 2, rmsWattsPerChannel: 110, ampClass: 'D' } as const;
	ampId = (await createPart({ kind: 'amplifier', sku: 'T-2CH', name: 'Test two-channel', ...base, rms4OhmW: 75, rms2OhmW: 110, minLoadOhm: 2, bridgeable: true, bridgedRmsW: 220 }, moderator)).id;
	speakerId = (await createPart({ kind: 'speaker', sku: 'T-W10', name: 'Test sub', cutoutMm: 232, mountingDepthMm: 128, voiceCoils: 2, ohmsPerCoil: 4 }, moderator)).id;
});
afterAll(() => closeDb());

describe('the load against a catalogue amplifier', () => {
	it('checks every wiring against the stored figures, bridged', async () => {
		const answer = await loadAnswer(loadInputSchema.parse({ drivers: [{ count: 1, coils: 2, ohmsPerCoil: 4 }], bridged: true, partId: ampId }));
		expect(answer.amplifier).toMatchObject({ id: ampId, sku: 'T-2CH' });
		// By hand: coils in parallel 2 Ω bridged → 1 Ω a side, below the 2 Ω minimum; in series 8 Ω → 4 Ω a side,
		// twice the 75 W a channel gives at 4 Ω = 150 W (8 Ω bridged is above the 4 Ω bridged rating).
		expect(answer.options.map((o) => [o.ohms, o.perSideOhms, o.check?.ok, o.check?.ratedW])).toEqual([
			[2, 1, false, null],
			[8, 4, true, 150]
		]);
	});

	it('refuses a part that is not an amplifier, and a number not in the catalogue', async () => {
		const notAmp = loadAnswer(loadInputSchema.parse({ drivers: [{ count: 1, coils: 1, ohmsPerCoil: 4 }], partId: speakerId }));
		await expect(notAmp).rejects.toMatchObject({ status: 400, message: `Part ${speakerId} (T-W10) is a speaker, not an amplifier.` });
		await expect(loadAnswer(loadInputSchema.parse({ drivers: [{ count: 1, coils: 1, ohmsPerCoil: 4 }], partId: 999_999 }))).rejects.toBeInstanceOf(ServiceError);
	});
});
