import type { Config } from 'tailwindcss';

export default {
  content: ['./app/**/*.{ts,tsx}', './features/**/*.{ts,tsx}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['var(--font-sans)', 'system-ui', 'sans-serif'],
      },
      colors: {
        // Channelsmith's own palette: a deep slate ink with a copper accent.
        ink: { DEFAULT: '#1c2430', soft: '#4a5565' },
        copper: { DEFAULT: '#b4582a', dark: '#8e431f', light: '#f6e7de' },
        verdict: { meets: '#1d7a46', marginal: '#a66a00', fails: '#b3261e' },
      },
    },
  },
} satisfies Config;
