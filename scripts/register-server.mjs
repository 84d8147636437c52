import { register } from "node:module";

register("./server-only-hooks.mjs", import.meta.url);
