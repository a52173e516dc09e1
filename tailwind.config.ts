import type { Config } from 'tailwindcss'
import defaultTheme from 'tailwindcss/defaultTheme'

/**
 * Tributary design tokens. Our own palette: a deep river-teal primary, a warm
 * ochre accent, slate neutrals, and a status scale that runs from "well
 * connected" (deep water) through "stable" (reed) to "losing diversity fast"
 * (clay) — deliberately not red/amber/green.
 */
export default <Partial<Config>>{
  content: [
    './components/**/*.{vue,ts}', './layouts/**/*.vue', './pages/**/*.vue',
    './composables/**/*.ts', './app.vue', './error.vue', './shared/**/*.ts',
  ],
  theme: {
    extend: {
      fontFamily: { sans: ['"Inter Variable"', 'Inter', ...defaultTheme.fontFamily.sans] },
      colors: {
        // Slate 500 a shade darker than Tailwind's (#64748b): small secondary text on the tinted
        // surfaces (slate-100, ochre-50, river-50) then keeps 4.5:1 contrast (WCAG AA).
        slate: { 500: '#5a6a80' },
        river: {
          50: '#eefaf9', 100: '#d3f1ef', 200: '#a9e2df', 300: '#74cbc8', 400: '#44aeac',
          500: '#2a9291', 600: '#1f7576', 700: '#1b5e60', 800: '#194c4e', 900: '#173f42', 950: '#0a2628',
        },
        ochre: {
          50: '#fdf8ec', 100: '#f9edcb', 200: '#f2d993', 300: '#ebc15b', 400: '#e4aa35',
          500: '#d38c20', 600: '#b56b18', 700: '#914e18', 800: '#773f1a', 900: '#643519', 950: '#391a09',
        },
        status: {
          connected: '#1d4e89', // deep water: well connected, F rising slowly
          stable: '#3f8f6b', // reed green-blue: stable
          watch: '#c9a227', // dry grass: watch
          declining: '#b5562a', // clay: losing diversity
          critical: '#6b2d5c', // heather: losing diversity fast
        },
      },
      boxShadow: {
        card: '0 1px 2px rgb(15 23 42 / 0.06), 0 1px 3px rgb(15 23 42 / 0.1)',
        raised: '0 10px 30px -10px rgb(10 38 40 / 0.35), 0 4px 10px -4px rgb(15 23 42 / 0.12)',
      },
      keyframes: {
        'rise-in': { from: { opacity: '0', transform: 'translateY(6px) scale(0.99)' }, to: { opacity: '1', transform: 'none' } },
        'fade-in': { from: { opacity: '0' }, to: { opacity: '1' } },
      },
      animation: {
        'rise-in': 'rise-in 140ms ease-out',
        'fade-in': 'fade-in 120ms ease-out',
      },
    },
  },
}
