import type { Config } from 'tailwindcss';

// The palette lives in src/app.css (@theme), where the dark setting can swap it.
export default {
	content: ['./src/**/*.{html,svelte,svx,ts}'],
	theme: {
		extend: {
			fontFamily: {
				serif: ['Merriweather', 'Georgia', 'serif'],
				sans: ['"IBM Plex Sans Variable"', 'system-ui', 'sans-serif']
			}
		}
	}
} satisfies Config;
