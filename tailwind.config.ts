import type { Config } from 'tailwindcss';

/**
 * Guyline's own palette: warm canvas neutrals for surfaces and text, a deep pine green for
 * actions and focus, rust for danger, ochre for cautions. Text colours are chosen so body text
 * stays above 7:1 and secondary text above 4.5:1 on the canvas-50 background.
 */
const config: Config = {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        canvas: {
          50: '#faf8f4',
          100: '#f3efe6',
          200: '#e6dfd0',
          300: '#d3c9b5',
          400: '#b3a88f',
          500: '#857a64',
          600: '#6a604c',
          700: '#4d463a',
          800: '#37322a',
          900: '#24201a',
        },
        pine: {
          50: '#eef6f4',
          100: '#d5e9e4',
          200: '#abd3c9',
          300: '#79b6a8',
          400: '#4a9484',
          500: '#2d7a6b',
          600: '#1f6357',
          700: '#194f46',
          800: '#143f38',
          900: '#0f2f2a',
        },
        rust: {
          50: '#fbf0ed',
          100: '#f5dbd3',
          200: '#e9b3a4',
          500: '#c0523a',
          600: '#a6412b',
          700: '#8a3323',
          800: '#6e291c',
        },
        ochre: {
          50: '#fcf6e8',
          100: '#f7e8c2',
          200: '#eed189',
          600: '#936410',
          700: '#77500c',
          800: '#5c3e0a',
        },
      },
      fontFamily: {
        sans: ['"Guyline Sans"', 'ui-sans-serif', 'system-ui', 'sans-serif'],
      },
    },
  },
};

export default config;
