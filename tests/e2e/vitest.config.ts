import { defineConfig } from 'vitest/config';

// Drives Debian's Chromium against the built app that scripts/test.sh starts (ORIGIN).
export default defineConfig({
	test: {
		include: ['tests/e2e/**/*.test.ts'],
		testTimeout: 60_000,
		hookTimeout: 60_000,
		fileParallelism: false,
		environment: 'node'
	}
});
