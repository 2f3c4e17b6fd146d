import { describe, expect, it } from 'vitest';
import { isActionFailure, isRedirect, redirect, error, isHttpError, type ActionFailure } from '@sveltejs/kit';
import { z } from 'zod';
import { formAction, type FormFailure } from '../../src/lib/server/forms';
import { EditConflictError, ServiceError } from '../../src/lib/server/errors';

function post(fields: Record<string, string>): Request {
	const body = new FormData();
	for (const [k, v] of Object.entries(fields)) body.append(k, v);
	return new Request('http://kickpanel.test/form', { method: 'POST', body });
}

async function failureOf(result: Promise<unknown>) {
	const answer = await result;
	if (!isActionFailure(answer)) throw new Error(`expected a refusal, got ${JSON.stringify(answer)}`);
	return answer as unknown as ActionFailure<FormFailure<unknown>>;
}

describe('one failure path for form actions', () => {
	it('passes what the body returns straight through', async () => {
		expect(await formAction(post({ name: 'Bay 3' }), async (posted) => ({ saved: posted.get('name') }))).toEqual({ saved: 'Bay 3' });
	});

	it('answers a service refusal with its status, the kept fields, its field errors and its message', async () => {
		const refusal = await failureOf(
			formAction(
				post({ email: 'fitter@shop.test', password: 'secret-typed', role: 'editor' }),
				async () => {
					throw new ServiceError('Someone already has an account with that e-mail address.', 409, { email: 'This address already has an account.' });
				},
				{ action: 'invite', values: ['email', 'role'] }
			)
		);
		expect(refusal.status).toBe(409);
		expect(refusal.data).toEqual({
			action: 'invite',
			values: { email: 'fitter@shop.test', role: 'editor' },
			errors: { email: 'This address already has an account.' },
			message: 'Someone already has an account with that e-mail address.'
		});
	});

	it('never sends back a field it was not told to keep', async () => {
		const refusal = await failureOf(
			formAction(post({ current: 'old-password', password: 'new-password' }), async () => {
				throw new ServiceError('The current password is not right.', 400, { current: 'The current password is not right.' });
			})
		);
		expect(refusal.data.values).toEqual({});
		expect(JSON.stringify(refusal.data)).not.toContain('new-password');
	});

	it('answers a schema refusal with 400, one message per field and the first as the message', async () => {
		const schema = z.object({ units: z.enum(['metric', 'imperial'], { error: 'Choose metric or imperial.' }), name: z.string().min(1, 'Enter a name.') });
		const refusal = await failureOf(formAction(post({ units: 'cubits', name: '' }), async (posted) => schema.parse(Object.fromEntries(posted))));
		expect(refusal.status).toBe(400);
		expect(refusal.data.errors).toEqual({ units: 'Choose metric or imperial.', name: 'Enter a name.' });
		expect(refusal.data.message).toBe('Choose metric or imperial.');
		expect(refusal.data.action).toBeNull();
	});

	it('answers an edit conflict as a 409 and lets the page rebuild its form from the refusal', async () => {
		const refusal = await failureOf(
			formAction(
				post({ summary: 'seat depth' }),
				async () => {
					throw new EditConflictError([{ path: 'seats.notes', label: 'Seat notes', base: 'a', theirs: 'b', yours: 'c' }], 42, {});
				},
				{ values: (posted, err) => ({ summary: String(posted.get('summary')), base: err instanceof EditConflictError ? err.latestRevisionId : null }) }
			)
		);
		expect(refusal.status).toBe(409);
		expect(refusal.data.values).toEqual({ summary: 'seat depth', base: 42 });
		expect(refusal.data.message).toContain('changed a field you changed too');
	});

	it('puts a service field error under the input the form names', async () => {
		const refusal = await failureOf(
			formAction(
				post({ yearTo: '1990' }),
				async () => {
					throw new ServiceError('Check the years.', 400, { 'identity.yearTo': 'The last year comes after the first.', 'identity.aliases.2': 'Too long.' });
				},
				{ inputName: (path) => path.replace(/^identity\./, '').split('.')[0] }
			)
		);
		expect(refusal.data.errors).toEqual({ yearTo: 'The last year comes after the first.', aliases: 'Too long.' });
	});

	it('lets redirects, HTTP errors and faults through untouched', async () => {
		const redirected = await formAction(post({}), async () => redirect(303, '/parts/7?saved=1')).catch((err) => err);
		expect(isRedirect(redirected)).toBe(true);
		const refused = await formAction(post({}), async () => error(403, 'This needs the moderator role.')).catch((err) => err);
		expect(isHttpError(refused)).toBe(true);
		await expect(formAction(post({}), async () => Promise.reject(new TypeError('bug')))).rejects.toThrow(TypeError);
	});
});
