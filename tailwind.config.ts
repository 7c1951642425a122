// Lugbook's own look: warm paper and ink, one blueprint-blue accent, and three verdict colours
// chosen to stay apart from the accent and from each other. Loaded from src/index.css with
// `@config` (Tailwind 4 does not find a JS/TS config by itself). Tailwind reads a default export.
import type { Config } from 'tailwindcss';

const config = {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        // Backgrounds: the page is paper, panels are a shade lighter, wells a shade deeper.
        paper: { DEFAULT: '#f7f3ea', bright: '#fffdf8', deep: '#eee7d8', edge: '#d9cdb8' },
        // Text: ink for reading, soft for secondary lines, faint only for large or decorative text.
        ink: { DEFAULT: '#26221e', soft: '#5a5248', faint: '#857b70' },
        accent: { DEFAULT: '#2d5189', strong: '#1e3a66', tint: '#e2e9f4' },
        pass: { DEFAULT: '#2d6a39', tint: '#e0eedf' },
        fail: { DEFAULT: '#a2312a', tint: '#f7e1dd' },
        marginal: { DEFAULT: '#865707', tint: '#f6ebd3' },
      },
      fontFamily: {
        sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif'],
        mono: ['"IBM Plex Mono"', 'ui-monospace', 'monospace'],
      },
    },
  },
} satisfies Config;

export default config;
