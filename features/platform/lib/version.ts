import { z } from "zod";

/** The optional edit counter a PATCH may name (the `version` columns): a change that names an older one answers 409. */
export const versionField = z
  .number({ error: "version is a whole number." })
  .int("version is a whole number.")
  .positive("version is a whole number.")
  .optional();
