// What ships to the phone. Read as the bundler sees it (type-only imports erased), so a
// page may name a validated type but never load the validation library.
const layers = require('./.dependency-cruiser.cjs');

/** @type {import('dependency-cruiser').IConfiguration} */
module.exports = {
	forbidden: [
		{
			name: 'no-validation-library-in-the-browser',
			comment:
				'Pages, components and the offline code are downloaded by every phone; zod checks forms, endpoints and saves on the server only. Plain names come from domain/content/vocabulary.ts, the field tree from vehicleFields.ts, figure checks from figureRules.ts.',
			severity: 'error',
			from: {
				path: [
					'^src/lib/components/',
					'^src/lib/offline/',
					'^src/service-worker\\.ts$',
					'^src/routes/.*[.]svelte$',
					'^src/routes/.*/?[+](page|layout)[.]ts$'
				]
			},
			to: { reachable: true, path: '(^|/)node_modules/zod/' }
		}
	],
	options: {
		...layers.options,
		tsPreCompilationDeps: false,
		// SvelteKit's generated tsconfig names $lib relative to .svelte-kit/, which the resolver misreads.
		tsConfig: { fileName: 'tsconfig.depcruise.json' }
	}
};
