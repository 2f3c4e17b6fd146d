import { z } from 'zod';
import { parseLength, type LengthUnit } from './units';

/** Form field: a typed length as millimetres, with the same messages as parseLength. */
export const lengthInputSchema = (defaultUnit: LengthUnit) =>
	z.string().transform((text, ctx) => {
		try {
			return parseLength(text, defaultUnit);
		} catch (e) {
			ctx.issues.push({ code: 'custom', message: (e as Error).message, input: text });
			return z.NEVER;
		}
	});
