import type { Config } from 'tailwindcss';
import { APP_COLOURS } from './src/lib/colours';

// The palette itself lives in src/lib/colours.ts, shared with the charts and the PDF.
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			colors: APP_COLOURS,
			fontFamily: {
				mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace'],
				sans: ['ui-sans-serif', 'system-ui', '"Segoe UI"', 'Roboto', 'Helvetica', 'Arial', 'sans-serif']
			}
		}
	}
} satisfies Config;
