import type { Config } from 'tailwindcss';

// Lariat's palette: a deep teal for identity, a warm saffron accent, slate neutrals.
// Loaded from src/styles.css through Tailwind v4's `@config`.
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  darkMode: 'class',
  theme: {
    extend: {
      fontFamily: { sans: ['Lato', 'system-ui', 'sans-serif'] },
      colors: {
        lariat: {
          50: '#eef8f7', 100: '#d5eeeb', 200: '#aadcd6', 300: '#74c3bb', 400: '#3fa39b',
          500: '#23877f', 600: '#1a6d67', 700: '#175853', 800: '#154744', 900: '#123b39', 950: '#072322',
        },
        saffron: { 300: '#f7cf6b', 400: '#f2b83a', 500: '#e09b14', 600: '#b9770d' },
      },
    },
  },
} satisfies Config;
