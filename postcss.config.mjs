/** Tailwind CSS v4 runs as a single PostCSS plugin; the theme lives in tailwind.config.ts (see app/globals.css). */
const config = {
  plugins: {
    "@tailwindcss/postcss": {},
  },
};

export default config;
