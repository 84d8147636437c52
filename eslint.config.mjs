import fs from "node:fs";
import nextCoreWebVitals from "eslint-config-next/core-web-vitals";
import nextTypescript from "eslint-config-next/typescript";
import prettier from "eslint-config-prettier";

// The layout rules (DEVELOPERS.md → Layout), enforced: `npm run lint` fails on an import that breaks one, and
// test/unit/layout-rules.test.ts proves each rule fires. features/platform is the shared layer, open to everyone.
const features = fs
  .readdirSync("features", { withFileTypes: true })
  .filter((d) => d.isDirectory() && d.name !== "platform")
  .map((d) => d.name);
const layoutZones = [
  {
    target: "./features/*/lib/**",
    from: [
      "./features/*/server/**",
      "./features/*/components/**",
      "./features/*/*.ts",
      "./features/*/*.tsx",
      "./app/**",
      "./db/**",
      "./emails/**",
      "./scripts/**",
    ],
    message: "lib/ imports only lib/ folders and the shared layer (features/platform/lib).",
  },
  {
    target: "./features/*/components/**",
    from: "./features/*/server/**",
    message: "Components never import server/ code: take data as props, or through the feature's api.ts.",
  },
  ...features.map((name) => ({
    target: `./features/!(${name})/**`,
    from: [`./features/${name}/server/**`],
    // (Exceptions of a glob zone are matched against the absolute path of the imported file.)
    except: [`**/features/${name}/server/index.ts`],
    message: `Another feature's server/ is reached only through its server/index.ts: import "@/features/${name}/server".`,
  })),
  {
    target: ["./features/**", "./db/**", "./emails/**"],
    from: "./app/**",
    message: "Only app/ and scripts/ import app/.",
  },
];

// Configuration is read in one place (features/platform/server/config.ts); NODE_ENV, which the framework inlines, is the
// one exception. test/unit/layout-rules.test.ts proves the rule fires.
const ENV_MESSAGE = "Read settings through config() from @/features/platform/server/config, not process.env.";
const envRule = [
  "error",
  {
    selector:
      "MemberExpression[object.type='MemberExpression'][object.object.name='process'][object.property.name='env'][property.name!='NODE_ENV']",
    message: ENV_MESSAGE,
  },
  {
    selector: "VariableDeclarator > MemberExpression.init[object.name='process'][property.name='env']",
    message: ENV_MESSAGE,
  },
  { selector: "SpreadElement > MemberExpression[object.name='process'][property.name='env']", message: ENV_MESSAGE },
];

const config = [
  ...nextCoreWebVitals,
  ...nextTypescript,
  // E-mails are rendered to static HTML, not Next.js pages.
  { files: ["emails/**"], rules: { "@next/next/no-head-element": "off" } },
  {
    files: ["app/**", "features/**", "db/**", "emails/**", "scripts/**"],
    rules: { "import/no-restricted-paths": ["error", { zones: layoutZones }] },
  },
  {
    files: ["app/**", "features/**", "db/**", "emails/**", "proxy.ts"],
    ignores: ["features/platform/server/config.ts", "**/*.test.ts"],
    rules: { "no-restricted-syntax": envRule },
  },
  // Formatting is Prettier's (npm run format); ESLint's own formatting rules are off.
  prettier,
  {
    ignores: [
      "node_modules/**",
      ".next/**",
      ".next-*/**",
      ".data/**",
      "db/migrations/**",
      "test/.artifacts/**",
      "next-env.d.ts",
    ],
  },
];

export default config;
