// The layout rules of eslint.config.mjs fire on a violation and stay quiet on the allowed form (DEVELOPERS.md → Layout).
// Each case lints a made-up file at a real place in the tree with ESLint's own API.
import path from "node:path";
import { ESLint } from "eslint";
import { describe, expect, it } from "vitest";

const eslint = new ESLint({ cwd: path.resolve(import.meta.dirname, "../..") });

async function layoutMessages(filePath: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return result!.messages.filter((m) => m.ruleId === "import/no-restricted-paths").map((m) => m.message);
}

describe("the layout rules", () => {
  it("lib/ imports only lib/ and the shared layer", async () => {
    expect(
      await layoutMessages(
        "features/planning/lib/probe.ts",
        'import { listTemplates } from "@/features/planning/server/templates";\nexport const x = listTemplates;\n',
      ),
    ).toEqual([expect.stringMatching(/lib\/ imports only lib\/ folders and the shared layer/)]);
    expect(
      await layoutMessages(
        "features/planning/lib/probe.ts",
        'import { SPORTS } from "@/features/athletes/schemas";\nexport const x = SPORTS;\n',
      ),
    ).toHaveLength(1);
    expect(
      await layoutMessages(
        "features/planning/lib/probe.ts",
        'import { addDays } from "@/features/platform/lib/days";\nimport { threeZones } from "@/features/zones/lib/zones";\nexport const x = [addDays, threeZones];\n',
      ),
    ).toEqual([]);
  });

  it("components never import server/", async () => {
    expect(
      await layoutMessages(
        "features/planning/components/Probe.tsx",
        'import { listTemplates } from "../server/templates";\nexport const x = listTemplates;\n',
      ),
    ).toEqual([expect.stringMatching(/Components never import server\//)]);
  });

  it("another feature's server/ only through its server/index.ts", async () => {
    expect(
      await layoutMessages(
        "features/logs/server/probe.ts",
        'import { listSessions } from "@/features/planning/server/sessions";\nexport const x = listSessions;\n',
      ),
    ).toEqual([expect.stringMatching(/only through its server\/index\.ts: import "@\/features\/planning\/server"/)]);
    expect(
      await layoutMessages(
        "features/logs/server/probe.ts",
        'import { listSessions } from "@/features/planning/server";\nexport const x = listSessions;\n',
      ),
    ).toEqual([]);
    // Inside the feature itself, and the shared layer from anywhere, are fine.
    expect(
      await layoutMessages(
        "feature./sessions/server/probe.ts",
        'import { listSessions } from "./planning";\nimport { route } from "@/features/platform/server/http";\nexport const x = [listSessions, route];\n',
      ),
    ).toEqual([]);
  });

  it("only app/ and scripts/ import app/", async () => {
    expect(
      await layoutMessages(
        "features/squads/server/probe.ts",
        'import * as r from "@/app/api/me/route";\nexport const x = r;\n',
      ),
    ).toEqual([expect.stringMatching(/Only app\/ and scripts\/ import app\//)]);
    expect(
      await layoutMessages("scripts/probe.ts", 'import * as r from "@/app/api/me/route";\nexport const x = r;\n'),
    ).toEqual([]);
  });
});

describe("configuration in one place", () => {
  const envMessages = async (filePath: string, code: string) => {
    const [result] = await eslint.lintText(code, { filePath });
    return result!.messages.filter((m) => m.ruleId === "no-restricted-syntax").map((m) => m.message);
  };

  it("no file under app/, features/ or db/ reads process.env except the config module (NODE_ENV excepted)", async () => {
    for (const code of [
      "export const x = process.env.DATABASE_URL;\n",
      'export const x = process.env["DATABASE_URL"];\n',
      "const env = process.env;\nexport const x = env;\n",
      "export const x = { ...process.env };\n",
    ]) {
      expect(await envMessages("features/planning/server/probe.ts", code), code).toEqual([
        expect.stringMatching(/through config\(\)/),
      ]);
    }
    expect(await envMessages("db/probe.ts", "export const x = process.env.DATABASE_URL;\n")).toHaveLength(1);
    expect(await envMessages("app/probe/page.tsx", "export const x = process.env.FAKE_EMAIL_PORT;\n")).toHaveLength(1);
    expect(
      await envMessages(
        "features/planning/server/probe.ts",
        'export const x = process.env.NODE_ENV === "production";\n',
      ),
    ).toEqual([]);
    expect(
      await envMessages("features/platform/server/config.ts", "export const x = process.env.DATABASE_URL;\n"),
    ).toEqual([]);
    expect(await envMessages("scripts/probe.ts", "export const x = process.env.DATABASE_URL;\n")).toEqual([]);
  });
});

describe("the import graph (scripts/import-graph.ts)", () => {
  it("has no folder-level cycle and no import that breaks a layout rule", async () => {
    const { analyse } = await import("../../scripts/import-graph");
    const { violations, cycles } = analyse();
    expect(violations).toEqual([]);
    expect(cycles).toEqual([]);
  });
});
