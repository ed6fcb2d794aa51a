import type { Config } from 'tailwindcss'

// Slakewise palette: cool slate for the shell, "temper" amber for heat and cautions,
// "bath" teal for quench and cool states. Kept small so states stay recognisable.
export default {
  content: ['./components/**/*.vue', './layouts/**/*.vue', './pages/**/*.vue', './app.vue', './composables/**/*.ts'],
  theme: {
    extend: {
      fontFamily: { sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif'] },
      colors: {
        ink: { 50: '#f5f7f9', 100: '#e6eaef', 200: '#cbd3dc', 400: '#8593a3', 600: '#4a5a6b', 800: '#1f2a36', 900: '#131b24' },
        temper: { 50: '#fff6e8', 100: '#fde7c2', 400: '#f0a53a', 600: '#c46f0c', 800: '#7a420a' },
        bath: { 50: '#e9f7f6', 100: '#c7ebe8', 400: '#3fb0a6', 600: '#1d7f77', 800: '#114c48' },
        alarm: { 50: '#fdeeee', 400: '#e26262', 600: '#b42828', 800: '#6e1717' },
      },
    },
  },
} satisfies Config
