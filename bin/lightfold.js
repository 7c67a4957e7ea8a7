#!/usr/bin/env node
// Entry point: runs the compiled CLI (built by `npm run build`, which `npm ci` runs via `prepare`).
import { main } from "../dist/src/cli/main.js";

main(process.argv).then((code) => {
  process.exitCode = code;
});
