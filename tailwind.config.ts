import type { Config } from 'tailwindcss';

// The ledger palette. Colours are CSS variables so the night theme can swap
// them all at once (see src/styles/index.css).
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        paper: 'var(--sl-paper)',
        'paper-deep': 'var(--sl-paper-deep)',
        ink: 'var(--sl-ink)',
        'ink-soft': 'var(--sl-ink-soft)',
        rule: 'var(--sl-rule)',
        brass: 'var(--sl-brass)',
        'brass-deep': 'var(--sl-brass-deep)',
        alert: 'var(--sl-alert)',
        good: 'var(--sl-good)',
      },
      fontFamily: {
        serif: ['"Source Serif 4 Variable"', 'Georgia', 'serif'],
        sans: ['"Public Sans Variable"', 'system-ui', 'sans-serif'],
      },
    },
  },
} satisfies Config;
