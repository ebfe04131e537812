import type { Config } from 'tailwindcss';

/*
 * Field-readable theme: neutral chrome, colour only for abnormal states.
 * Every text/background pair used for state messages keeps a contrast ratio of at least 7:1
 * (WCAG 2.x level AAA for body text).
 */
export default {
  content: ['./client/index.html', './client/src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      fontFamily: {
        mono: ['"JetBrains Mono"', 'ui-monospace', 'SFMono-Regular', 'Menlo', 'monospace'],
      },
      colors: {
        /** Something is wrong or failed: errors, rejected input, service down. */
        alarm: { 50: '#fef2f2', 300: '#f19a9a', 700: '#b91c1c', 900: '#7f1d1d' },
        /** Needs attention but nothing failed: plan warnings, standing cautions. */
        caution: { 50: '#fffbeb', 300: '#f5c451', 700: '#a14d07', 950: '#451a03' },
      },
      minHeight: { touch: '2.75rem' },
      minWidth: { touch: '2.75rem' },
    },
  },
} satisfies Config;
