import type { Config } from 'tailwindcss';

// Ringdown's own palette: slate ink on warm paper, a teal "after" tone, a muted clay "before".
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				ink: { DEFAULT: '#1d2430', soft: '#4a5566', faint: '#8a93a3' },
				paper: { DEFAULT: '#f7f5f0', raised: '#ffffff', sunk: '#eceae3' },
				after: { DEFAULT: '#0f766e', soft: '#99d5cd' },
				before: { DEFAULT: '#a8764f', soft: '#e6cdb8' },
				target: { DEFAULT: '#6d5bd0', soft: '#dcd6f7' },
				alarm: { DEFAULT: '#b42318', soft: '#fde4e1' },
				caution: { DEFAULT: '#a15c07', soft: '#fdf0d5' }
			},
			fontFamily: {
				mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace'],
				sans: ['ui-sans-serif', 'system-ui', '"Segoe UI"', 'Roboto', 'Helvetica', 'Arial', 'sans-serif']
			}
		}
	}
} satisfies Config;
