import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { ServiceError } from '$lib/server/errors';
import { formAction, textFields } from '$lib/server/forms';
import { catalogue } from '$lib/server/services/vehicles';
import { createVehicle } from '$lib/server/services/revisions';
import { CONTENT_SCHEMA_VERSION } from '$lib/domain/content/schema';
import { vehicleSlug } from '$lib/domain/slug';

const FIELDS = ['make', 'model', 'yearFrom', 'yearTo', 'body', 'market', 'aliases'] as const;
type Values = Record<(typeof FIELDS)[number], string>;

const text = (v: string | null, max = 120) => (v ?? '').trim().slice(0, max);

export const load: PageServerLoad = async ({ locals, url }) => {
	const user = requireRole(locals, 'editor');
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
	const makes = await catalogue(user);
	return { values, makes: makes.map((m) => ({ name: m.name, models: m.models.map((mo) => mo.name) })) };
};

const year = (v: string) => (v.trim() === '' ? undefined : Number(v.trim()));

function identityFrom(values: Values) {
	return {
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
}

/** What was typed, and on a clash the address of the page that already covers it. */
function typedAgain(posted: FormData, refusal: unknown): Values & { existing: string | null } {
	const values = textFields(posted, FIELDS) as Values;
	const identity = identityFrom(values);
	const clash = refusal instanceof ServiceError && refusal.status === 409;
	const existing =
		clash && typeof identity.yearFrom === 'number' && typeof identity.yearTo === 'number'
			? vehicleSlug({ ...identity, yearFrom: identity.yearFrom, yearTo: identity.yearTo })
			: null;
	return { ...values, existing };
}

export const actions: Actions = {
	default: async ({ locals, request }) => {
		const user = requireRole(locals, 'editor');
		return formAction(
			request,
			async (posted) => {
				const typed = textFields(posted, FIELDS) as Values;
				// The last year defaults to the first, so with neither typed only the first is asked for.
				if (!typed.yearFrom.trim() && !typed.yearTo.trim()) {
					throw new ServiceError('Type the first model year; nothing was saved yet.', 400, {
						yearFrom: 'Type the first model year, for example 2012. Leave the last one empty when the page covers one year.'
					});
				}
				const identity = identityFrom(typed);
				const { slug } = await createVehicle({ schemaVersion: CONTENT_SCHEMA_VERSION, identity }, user, 'New page');
				redirect(303, `/vehicles/${slug}/edit?created=1`);
			},
			// The service names content paths ("identity.yearTo"); the form names inputs ("yearTo").
			{ values: typedAgain, inputName: (path) => path.replace(/^identity\./, '').split('.')[0] }
		);
	}
};
