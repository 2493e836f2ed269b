import localFont from "next/font/local";

// Merriweather ships inside the app from @fontsource files: nothing is fetched at build or run time.
// Each subset is its own family: the latin-ext files hold only the extra letters, so they follow the
// latin ones in the font stack instead of shadowing them. (next/font needs literal paths.)
export const merriweather = localFont({
  src: [
    { path: "../node_modules/@fontsource/merriweather/files/merriweather-latin-400-normal.woff2", weight: "400", style: "normal" },
    { path: "../node_modules/@fontsource/merriweather/files/merriweather-latin-700-normal.woff2", weight: "700", style: "normal" },
  ],
  variable: "--font-merriweather",
  display: "swap",
});

export const merriweatherExt = localFont({
  src: [
    { path: "../node_modules/@fontsource/merriweather/files/merriweather-latin-ext-400-normal.woff2", weight: "400", style: "normal" },
    { path: "../node_modules/@fontsource/merriweather/files/merriweather-latin-ext-700-normal.woff2", weight: "700", style: "normal" },
  ],
  variable: "--font-merriweather-ext",
  display: "swap",
  // Fetched only when a page has a letter the latin files lack, not ahead on every page.
  preload: false,
});
