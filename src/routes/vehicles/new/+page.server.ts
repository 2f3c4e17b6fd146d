import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { catalogue } from '$lib/server/services/vehicles';
import { createVehicle } from '$lib/server/services/revisions';
import { ServiceError } from '$lib/server/errors';
import { CONTENT_SCHEMA_VERSION } from '$lib/domain/content/schema';
import { vehicleSlug } from '$lib/domain/slug';

const FIELDS = ['make', 'model', 'yearFrom', 'yearTo', 'body', 'market', 'aliases'] as const;
type Values = Record<(typeof FIELDS)[number], string>;

const text = (v: string | null, max = 120) => (v ?? '').trim().slice(0, max);

export const load: PageServerLoad = async ({ locals, url }) => {
	requireRole(locals, 'editor');
	const year = /^\d{4}$/.test(url.searchParams.get('year') ?? '') ? String(url.searchParams.get('year')) : '';
	const values: Values = {
		make: text(url.searchParams.get('make')),
		model: text(url.searchParams.get('model')),
		yearFrom: year,
		yearTo: year,
		body: text(url.searchParams.get('body'), 20),
		market: '',
		aliases: ''
	};
	const makes = await catalogue();
	return { values, makes: makes.map((m) => ({ name: m.name, models: m.models.map((mo) => mo.name) })) };
};

const year = (v: string) => (v.trim() === '' ? undefined : Number(v.trim()));

export const actions: Actions = {
	default: async ({ locals, request }) => {
		const user = requireRole(locals, 'editor');
		const form = await request.formData();
		const values = Object.fromEntries(FIELDS.map((f) => [f, String(form.get(f) ?? '')])) as Values;
		const identity = {
			make: values.make,
			model: values.model,
			yearFrom: year(values.yearFrom),
			yearTo: year(values.yearTo) ?? year(values.yearFrom),
			body: values.body,
			market: values.market,
			aliases: values.aliases
				.split(/\r?\n/)
				.map((a) => a.trim())
				.filter(Boolean)
		};
		let slug: string;
		try {
			({ slug } = await createVehicle({ schemaVersion: CONTENT_SCHEMA_VERSION, identity }, user, 'New page'));
		} catch (err) {
			if (!(err instanceof ServiceError)) throw err;
			const errors: Record<string, string> = {};
			for (const [path, message] of Object.entries(err.fieldErrors ?? {})) {
				const field = path.replace(/^identity\./, '').split('.')[0];
				errors[field] ??= message;
			}
			const existing =
				err.status === 409 && typeof identity.yearFrom === 'number' && typeof identity.yearTo === 'number'
					? vehicleSlug({ ...identity, yearFrom: identity.yearFrom, yearTo: identity.yearTo })
					: null;
			return fail(err.status, { values, errors, message: err.message, existing });
		}
		redirect(303, `/vehicles/${slug}/edit?created=1`);
	}
};
