// Layers: routes → views → services → domain. `npm run check` fails on any rule below.
/** @type {import('dependency-cruiser').IConfiguration} */
module.exports = {
	forbidden: [
		{
			name: 'no-cycle',
			comment: 'Modules that import each other cannot be read, tested or loaded one at a time. A component that renders itself (nested entries) is not a cycle.',
			severity: 'error',
			from: { path: '(.+)' },
			to: { circular: true, pathNot: '^$1$' }
		},
		{
			name: 'domain-stays-pure',
			comment: 'Domain code runs in the browser and in tests without I/O: no server code, SvelteKit runtime, components or routes.',
			severity: 'error',
			from: { path: '^src/lib/domain/' },
			to: { path: ['^src/lib/server/', '^src/lib/components/', '^src/routes/', '^src/hooks', '^src/auth\\.ts$', '^\\$app/', '^\\$env/'] }
		},
		{
			name: 'components-stay-client-safe',
			comment: 'Components are shipped to the browser; server code must never reach them.',
			severity: 'error',
			from: { path: '^src/lib/components/' },
			to: { path: ['^src/lib/server/', '^src/routes/', '^src/hooks', '^src/auth\\.ts$', '^\\$env/(static|dynamic)/private'] }
		},
		{
			name: 'services-below-pages',
			comment: 'Services are use cases; pages and views call them, never the other way round.',
			severity: 'error',
			from: { path: '^src/lib/server/services/' },
			to: { path: ['^src/routes/', '^src/lib/server/views/', '^src/hooks', '^src/auth\\.ts$', '^\\$app/'] }
		},
		{
			name: 'auth-below-services',
			comment: 'Password hashing, throttling and cookies are used by the account services, never the reverse.',
			severity: 'error',
			from: { path: '^src/lib/server/auth/' },
			to: { path: '^src/lib/server/(services|views)/' }
		},
		{
			name: 'server-below-routes',
			comment: 'Nothing under src/lib imports a page, an endpoint or the hooks.',
			severity: 'error',
			from: { path: '^src/lib/' },
			to: { path: ['^src/routes/', '^src/hooks', '^src/auth\\.ts$'] }
		}
	],
	options: {
		doNotFollow: { path: 'node_modules' },
		exclude: { path: '^\\.svelte-kit/' },
		tsPreCompilationDeps: true,
		// Resolves $lib from the repository root (SvelteKit's generated tsconfig names it relative to .svelte-kit/).
		tsConfig: { fileName: 'tsconfig.depcruise.json' },
		enhancedResolveOptions: {
			exportsFields: ['exports'],
			conditionNames: ['import', 'svelte', 'types', 'default'],
			extensions: ['.ts', '.js', '.svelte', '.json']
		}
	}
};
