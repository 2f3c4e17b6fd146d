import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';
import { mdsvex } from 'mdsvex';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	extensions: ['.svelte', '.svx'],
	preprocess: [vitePreprocess(), mdsvex({ extensions: ['.svx'] })],
	kit: {
		adapter: adapter({ out: 'build', precompress: true }),
		csrf: { trustedOrigins: [] },
		// Hashes, not nonces: a page sent again from the page memo carries the same scripts and header.
		csp: {
			mode: 'hash',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				// Svelte's transitions and SVG figures set inline styles.
				'style-src': ['self', 'unsafe-inline'],
				// Notes may show only the app's own photos.
				'img-src': ['self', 'data:', 'blob:'],
				'font-src': ['self'],
				'connect-src': ['self'],
				// The service worker that keeps pages for reading with no signal.
				'worker-src': ['self'],
				'manifest-src': ['self'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'form-action': ['self'],
				'frame-ancestors': ['none']
			}
		}
	},
	onwarn: (warning, handler) => {
		// mdsvex still emits the legacy module-script form
		if (warning.code === 'script_context_deprecated') return;
		handler(warning);
	}
};

export default config;
