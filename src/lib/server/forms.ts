import { fail, type ActionFailure } from '@sveltejs/kit';
import { ZodError } from 'zod';
import { ServiceError, fieldMessages } from './errors';
import { DATABASE_DOWN_MESSAGE, noteDatabaseError } from './db/availability';

/**
 * What every refused form action answers, the counterpart of `apiCall`'s JSON: which of the page's
 * forms was refused (null when it has one), what was typed, a message per field and one for the form.
 */
export type FormFailure<V = Record<string, string>> = {
	action: string | null;
	values: V;
	errors: Record<string, string>;
	message: string;
};

type Refusal = { status: number; errors: Record<string, string>; message: string };

function refusalOf(err: unknown): Refusal | null {
	if (err instanceof ZodError) return { status: 400, errors: fieldMessages(err), message: err.issues[0]?.message ?? 'Check the form and try again.' };
	if (err instanceof ServiceError) return { status: err.status, errors: err.fieldErrors ?? {}, message: err.message };
	// Everything typed goes back to the form, as for any other refusal.
	if (noteDatabaseError(err)) return { status: 503, errors: {}, message: DATABASE_DOWN_MESSAGE };
	return null;
}

/** Field errors under the names of the form's inputs; the first message for an input wins. */
function underInputs(errors: Record<string, string>, inputName: (path: string) => string): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [path, message] of Object.entries(errors)) out[inputName(path)] ??= message;
	return out;
}

export type FormOptions<V> = {
	/** Names the form on a page with several, so only that one shows the refusal. */
	action?: string;
	/** The posted fields to show again (never a password), or how to rebuild the form from the post and the refusal. */
	values?: readonly string[] | ((posted: FormData, refusal: unknown) => V);
	/** The input that shows a service's field error, when the service names fields by another path. */
	inputName?: (path: string) => string;
};

/**
 * Runs a form action's body with the posted fields. A refusal (a ServiceError from a service, a ZodError
 * from a schema) becomes `fail(status, { action, values, errors, message })`; anything else, including
 * SvelteKit's redirects and HTTP errors, passes through.
 */
export async function formAction<T, V = Record<string, string>>(
	request: Request,
	body: (posted: FormData) => Promise<T>,
	options: FormOptions<V> = {}
): Promise<T | ActionFailure<FormFailure<V>>> {
	const posted = await request.formData();
	try {
		return await body(posted);
	} catch (err) {
		const refusal = refusalOf(err);
		if (!refusal) throw err;
		const keep = options.values ?? [];
		const values = typeof keep === 'function' ? keep(posted, err) : (textFields(posted, keep) as V);
		const errors = options.inputName ? underInputs(refusal.errors, options.inputName) : refusal.errors;
		return fail(refusal.status, { action: options.action ?? null, values, errors, message: refusal.message });
	}
}

/** The named fields of a posted form or a query string as text; a missing field or a file reads as "". */
export function textFields<K extends string>(posted: { get(name: string): FormDataEntryValue | null }, names: readonly K[]): Record<K, string> {
	return Object.fromEntries(
		names.map((name) => {
			const value = posted.get(name);
			return [name, typeof value === 'string' ? value : ''];
		})
	) as Record<K, string>;
}
