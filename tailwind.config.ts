import type { Config } from 'tailwindcss';

// Cohesia's palette and type, defined once and used by name
// (loaded from src/styles.css with `@config`).
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        ink: '#1d2a33',
        paper: '#f7f5ef',
        dusk: '#24506b',
        reed: '#6b8f71',
        ember: '#c8733a',
        plum: '#6d4c7d',
        mist: '#dfe5e8',
      },
      fontFamily: {
        serif: ['Merriweather', 'Georgia', 'serif'],
        sans: ['Inter', 'system-ui', 'sans-serif'],
      },
    },
  },
} satisfies Config;
