import type { ZodError } from 'zod';

/** zod issues as one message per field path, for showing beside each input. */
export function fieldMessages(error: ZodError): Record<string, string> {
	const out: Record<string, string> = {};
	for (const issue of error.issues) {
		const key = issue.path.length ? issue.path.join('.') : 'form';
		out[key] ??= issue.message;
	}
	return out;
}
