import type { Config } from 'tailwindcss';

/**
 * Headroom's own palette: a deep "standpipe" blue-green for the brand, warm paper and ink
 * for reading, and copper for focus and emphasis. Text pairs meet WCAG 2.2 AA contrast
 * (4.5:1 for text, 3:1 for focus rings and borders that carry meaning); meaning is never
 * carried by colour alone: every status also has a word.
 */
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        ink: { DEFAULT: '#17222a', soft: '#3d4a53', muted: '#56626b' },
        paper: { DEFAULT: '#f6f4ee', deep: '#ebe7dc' },
        surface: '#ffffff',
        rule: { DEFAULT: '#c7c9c3', strong: '#8b9096' },
        standpipe: { DEFAULT: '#123f4a', strong: '#0b2c34', soft: '#dbe8ea' },
        copper: { DEFAULT: '#a4501c', soft: '#f6e4d6', light: '#eaa97c' },
        fault: { DEFAULT: '#9b1c1c', soft: '#fbe5e3' },
        sound: { DEFAULT: '#22613f', soft: '#e1f0e6' },
        caution: { DEFAULT: '#7a5200', soft: '#fbefd2' },
      },
      fontFamily: {
        sans: ['"Work Sans"', 'ui-sans-serif', 'system-ui', 'sans-serif'],
      },
      maxWidth: {
        page: '72rem',
      },
    },
  },
} satisfies Config;
