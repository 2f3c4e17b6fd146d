import type { z } from 'zod';

/** Parses calculator input, throwing a RangeError whose message lists every reason in plain words. */
export function parseInput<T>(schema: z.ZodType<T>, input: unknown): T {
	const result = schema.safeParse(input);
	if (!result.success) throw new RangeError(result.error.issues.map((i) => i.message).join(' '));
	return result.data;
}
