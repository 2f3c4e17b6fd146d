import type { Config } from 'tailwindcss';

// Warm graphite neutrals, one copper accent (bare wire), verdict colours that always travel with a word and a symbol.
export default {
	content: ['./src/**/*.{html,svelte,svx,ts}'],
	theme: {
		extend: {
			colors: {
				graphite: {
					50: '#f7f6f4',
					100: '#eceae6',
					200: '#d8d4cd',
					300: '#b9b3a9',
					400: '#8f887c',
					500: '#6d665b',
					600: '#544e45',
					700: '#403b34',
					800: '#2b2824',
					900: '#1c1a17'
				},
				copper: {
					50: '#fbf3ec',
					100: '#f5e0cd',
					200: '#eabf98',
					300: '#dc9a63',
					400: '#c9783b',
					500: '#b4622a',
					600: '#964d20',
					700: '#773c1b',
					800: '#5b2f18',
					900: '#3f2113'
				},
				verdict: {
					fits: '#1f6f43',
					tight: '#8a5a00',
					nofit: '#a3231f',
					unknown: '#4a5568'
				}
			},
			fontFamily: {
				serif: ['Merriweather', 'Georgia', 'serif'],
				sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif']
			}
		}
	}
} satisfies Config;
