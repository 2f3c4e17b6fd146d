import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';
import { coreFaces } from './scripts/font-faces.ts';

export default defineConfig({
	plugins: [coreFaces(), tailwindcss(), sveltekit()],
	server: { host: '127.0.0.1' },
	test: {
		include: ['tests/unit/**/*.test.ts', 'tests/integration/**/*.test.ts'],
		environment: 'node',
		testTimeout: 30_000,
		hookTimeout: 60_000,
		fileParallelism: true
	}
});
