import { error, isHttpError, json } from '@sveltejs/kit';
import type { ZodType } from 'zod';
import { EditConflictError, ServiceError, fieldMessages } from './errors';
import { DATABASE_DOWN_MESSAGE, noteDatabaseError } from './db/availability';
import { requireRole } from './auth/guard';

/** Runs an API handler body and answers refusals as JSON 4xx with a message a person understands. */
export async function apiCall(body: () => Promise<Response>): Promise<Response> {
	try {
		return await body();
	} catch (err) {
		if (err instanceof EditConflictError) {
			return json({ message: err.message, conflicts: err.conflicts, latestRevisionId: err.latestRevisionId }, { status: 409 });
		}
		if (err instanceof ServiceError) {
			return json({ message: err.message, fieldErrors: err.fieldErrors }, { status: err.status });
		}
		if (isHttpError(err)) return json({ message: err.body.message }, { status: err.status });
		if (noteDatabaseError(err)) return json({ message: DATABASE_DOWN_MESSAGE }, { status: 503, headers: { 'retry-after': '5' } });
		throw err;
	}
}

const JSON_TYPE = /^application\/(?:[\w.+-]+\+)?json\s*(?:;|$)/i;

/**
 * A JSON body checked against its schema. The content type must say JSON: a cross-site form can
 * send text/plain without asking the browser first, but never application/json.
 */
export async function readJson<T>(request: Request, schema: ZodType<T>): Promise<T> {
	if (!JSON_TYPE.test(request.headers.get('content-type') ?? '')) {
		throw new ServiceError('Send the body as JSON, with the header "Content-Type: application/json".', 415);
	}
	let raw: unknown;
	try {
		raw = await request.json();
	} catch {
		throw new ServiceError('The request body must be JSON.', 400);
	}
	const parsed = schema.safeParse(raw);
	if (!parsed.success) {
		const fields = fieldMessages(parsed.error);
		throw new ServiceError(Object.entries(fields).map(([k, v]) => (k === 'form' ? v : `${k}: ${v}`)).join(' '), 400, fields);
	}
	return parsed.data;
}

/** The body read ahead without using it up, to see which form of a request was sent; null if not JSON. */
export async function peekJson(request: Request): Promise<Record<string, unknown> | null> {
	const raw: unknown = await request
		.clone()
		.json()
		.catch(() => null);
	return raw && typeof raw === 'object' ? (raw as Record<string, unknown>) : null;
}

export function queryInt(url: URL, name: string, range: { min: number; max: number }): number | undefined {
	const raw = url.searchParams.get(name);
	if (raw === null || raw === '') return undefined;
	const n = Number(raw);
	if (!Number.isInteger(n) || n < range.min || n > range.max) {
		error(400, `"${name}" must be a whole number from ${range.min} to ${range.max}.`);
	}
	return n;
}

/** For pages and form actions: a service refusal becomes an HTTP error page with its message. */
export function asHttpError(err: unknown): never {
	if (err instanceof ServiceError) error(err.status, err.message);
	if (noteDatabaseError(err)) error(503, DATABASE_DOWN_MESSAGE);
	throw err;
}

/**
 * A calculator endpoint: any signed-in person may ask; the body is checked against the calculator's
 * schema (400 with a message per field) and the answer is JSON.
 */
export function calcPost<T>(schema: ZodType<T>, answer: (input: T) => unknown): (event: { locals: App.Locals; request: Request }) => Promise<Response> {
	return ({ locals, request }) =>
		apiCall(async () => {
			requireRole(locals, 'viewer');
			const input = await readJson(request, schema);
			return json(await answer(input));
		});
}
