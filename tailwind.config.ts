import type { Config } from 'tailwindcss';

/**
 * Tangentry's design tokens: the "drafting table" visual language of the product brief.
 * Loaded from src/styles.css with `@config "../tailwind.config.ts";` (Tailwind 4).
 *
 * Day: ink on paper. Night (prefers-color-scheme: dark, Tailwind's default `dark:` variant):
 * paper-coloured text on the night ink. Status colours always travel with a word, never alone.
 */
const config = {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        paper: '#f5f1e8',
        card: '#fffdf8',
        ink: '#1b2a41',
        grid: {
          minor: '#d7e0ea',
          major: '#a9bccf',
        },
        /** Selection and focus. */
        vermilion: '#d2452b',
        /** Within budget / service up. */
        moss: '#3f7d4e',
        /** Near budget / waiting. */
        amber: '#c8891b',
        /** Over budget / service down. */
        brick: '#a63a2b',
        /** Night variant: background, raised card and grid lines. */
        night: {
          DEFAULT: '#0f1826',
          card: '#172336',
          line: '#2a3a52',
        },
      },
      fontFamily: {
        sans: [
          '"IBM Plex Sans"',
          'system-ui',
          '-apple-system',
          '"Segoe UI"',
          'Roboto',
          '"Helvetica Neue"',
          'Arial',
          'sans-serif',
        ],
        mono: [
          '"IBM Plex Mono"',
          'ui-monospace',
          'SFMono-Regular',
          'Menlo',
          'Consolas',
          '"Liberation Mono"',
          'monospace',
        ],
      },
    },
  },
} satisfies Config;

export default config;
