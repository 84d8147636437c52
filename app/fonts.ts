import localFont from "next/font/local";

// Inter (SIL Open Font License) from the @fontsource-variable/inter npm package, served with the app.
export const tidemarkSans = localFont({
  src: "../node_modules/@fontsource-variable/inter/files/inter-latin-wght-normal.woff2",
  variable: "--font-tidemark",
  display: "swap",
  weight: "100 900",
});
