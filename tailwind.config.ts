import type { Config } from 'tailwindcss';

const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['var(--font-sans)', 'system-ui', 'sans-serif'],
        mono: ['var(--font-mono)', 'ui-monospace', 'monospace'],
      },
      colors: {
        // Splitfield's own palette: slate ink on paper, a teal accent, amber for attention.
        ink: { DEFAULT: '#1d2733', soft: '#4a5868', faint: '#8795a6' },
        paper: { DEFAULT: '#f7f6f2', raised: '#ffffff', sunk: '#eeece6' },
        accent: { DEFAULT: '#0f766e', soft: '#ccebe7', strong: '#0b5953' },
        warn: { DEFAULT: '#b45309', soft: '#fdecd3' },
        danger: { DEFAULT: '#b42318', soft: '#fde4e1' },
      },
    },
  },
};
export default config;
