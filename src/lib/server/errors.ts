import type { ZodError } from 'zod';
import type { MergeConflict } from '../domain/content/merge';

/** A refusal a person can act on; routes turn it into a 4xx with this message. */
export class ServiceError extends Error {
	constructor(
		message: string,
		readonly status: 400 | 401 | 403 | 404 | 409 | 413 | 415 | 422 | 429 | 503 = 400,
		readonly fieldErrors?: Record<string, string>
	) {
		super(message);
	}
}

export class NoChangeError extends ServiceError {
	constructor() {
		super('No change: this is the same as the current revision, so nothing was saved.', 400);
	}
}

/** Both the editor and someone else changed the same field since the editor's base revision. */
export class EditConflictError extends ServiceError {
	constructor(
		readonly conflicts: MergeConflict[],
		readonly latestRevisionId: number,
		readonly merged: unknown,
		/** Who saved the newest revision meanwhile, and when (ISO). */
		readonly meanwhile: { by: string; at: string } | null = null
	) {
		super(
			`Someone else saved this page while you were editing, and changed ${conflicts.length === 1 ? 'a field' : `${conflicts.length} fields`} you changed too. Choose a value for each, then save again.`,
			409
		);
	}
}

/** zod issues as one message per field path, for showing beside each input. */
export function fieldMessages(error: ZodError): Record<string, string> {
	const out: Record<string, string> = {};
	for (const issue of error.issues) {
		const key = issue.path.length ? issue.path.join('.') : 'form';
		out[key] ??= issue.message;
	}
	return out;
}

/** A form that did not pass its schema, refused with the first problem as the message and one per field. */
export function invalidInput(error: ZodError): never {
	const fields = fieldMessages(error);
	throw new ServiceError(Object.values(fields)[0] ?? 'Check the form.', 400, fields);
}
