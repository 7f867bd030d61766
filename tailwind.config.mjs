import forms from '@tailwindcss/forms';

/**
 * Cagewright's own palette: cool steel neutrals for metal and chrome, one "iris" violet accent
 * for the user's selection, and three semantic colours for findings (blocks fit, hurts the crop,
 * advice) that always travel with an icon shape and text.
 */
/** @type {import('tailwindcss').Config} */
export default {
  content: ['./src/**/*.{astro,html,js,jsx,ts,tsx,md}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['"Source Sans 3"', 'system-ui', 'sans-serif'],
      },
      colors: {
        ink: { DEFAULT: '#1c2430', soft: '#3d4a5c', muted: '#5f6b7c' },
        steel: {
          50: '#f5f7f9',
          100: '#e9edf1',
          200: '#d3dae2',
          300: '#b3bfcb',
          400: '#8c9bab',
          500: '#6b7b8d',
          600: '#536273',
          700: '#414d5b',
          800: '#2e3742',
          900: '#1d242c',
        },
        iris: {
          50: '#f4f1fd',
          100: '#e8e1fb',
          200: '#d2c4f6',
          300: '#b39cef',
          400: '#9372e5',
          500: '#7851d6',
          600: '#633cbd',
          700: '#51319a',
          800: '#42297c',
          900: '#2f1d59',
        },
        fit: { DEFAULT: '#b3261e', soft: '#fde8e6', line: '#e5a19b' },
        crop: { DEFAULT: '#a35200', soft: '#fff1df', line: '#f0bf85' },
        advice: { DEFAULT: '#1f5fa8', soft: '#e6f0fb', line: '#9cc0e8' },
        ok: { DEFAULT: '#2f6f4f', soft: '#e6f4ec' },
      },
      screens: { wall: '1920px' },
    },
  },
  plugins: [forms],
};
