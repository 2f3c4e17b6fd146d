import { z } from 'zod';
import type { Problem, Rule } from './figureRules';

/** A figure rule as a zod schema, for endpoints and forms: each problem becomes an issue at its path. */
export function schemaOf<T>(rule: Rule<T>): z.ZodType<T> {
	return z.unknown().transform((value, ctx) => {
		const problems: Problem[] = [];
		const read = rule(value, [], problems);
		for (const p of problems) ctx.issues.push({ code: 'custom', message: p.message, path: p.path, input: value });
		return problems.length > 0 ? z.NEVER : read;
	}) as unknown as z.ZodType<T>;
}
