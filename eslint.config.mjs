import nextCoreWebVitals from "eslint-config-next/core-web-vitals";
import nextTypescript from "eslint-config-next/typescript";

const config = [
  ...nextCoreWebVitals,
  ...nextTypescript,
  // E-mails are rendered to static HTML, not Next.js pages.
  { files: ["emails/**"], rules: { "@next/next/no-head-element": "off" } },
  { ignores: ["node_modules/**", ".next/**", ".next-*/**", ".data/**", "db/migrations/**", "test/.artifacts/**", "next-env.d.ts"] },
];

export default config;
