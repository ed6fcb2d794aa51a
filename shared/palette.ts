/**
 * Slakewise palette: cool slate "ink" for the shell, "temper" amber for heat and cautions,
 * "bath" teal for quench and cool states, "alarm" red for conflicts and deviations.
 * Kept small so states stay recognisable. The one source for the Tailwind classes, the
 * charts (which take colour values, not classes) and the e-mail and PDF sheets.
 */
export const palette = {
  ink: { 50: '#f5f7f9', 100: '#e6eaef', 200: '#cbd3dc', 400: '#8593a3', 600: '#4a5a6b', 800: '#1f2a36', 900: '#131b24' },
  temper: { 50: '#fff6e8', 100: '#fde7c2', 400: '#f0a53a', 600: '#c46f0c', 800: '#7a420a' },
  bath: { 50: '#e9f7f6', 100: '#c7ebe8', 400: '#3fb0a6', 600: '#1d7f77', 800: '#114c48' },
  alarm: { 50: '#fdeeee', 400: '#e26262', 600: '#b42828', 800: '#6e1717' },
} as const

/** Plain white as a value, for the sheets and charts; Tailwind has its own `white` class, so it stays out of the palette. */
export const white = '#ffffff'
