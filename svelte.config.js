import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';
import { mdsvex } from 'mdsvex';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	extensions: ['.svelte', '.svx'],
	preprocess: [vitePreprocess(), mdsvex({ extensions: ['.svx'] })],
	kit: {
		adapter: adapter({ out: 'build', precompress: true }),
		csrf: { trustedOrigins: [] }
	},
	onwarn: (warning, handler) => {
		// mdsvex still emits the legacy module-script form
		if (warning.code === 'script_context_deprecated') return;
		handler(warning);
	}
};

export default config;
