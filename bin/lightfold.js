#!/usr/bin/env node
// Entry point: runs the compiled CLI (built by `npm run build`, which `npm ci` runs via `prepare`).
import { main } from "../dist/src/cli/main.js";

// A closed pipe (`lightfold materials | head`) ends the output quietly instead of crashing.
for (const stream of [process.stdout, process.stderr]) {
  stream.on("error", (err) => {
    if (err && err.code === "EPIPE") process.exit(0);
    throw err;
  });
}

main(process.argv).then((code) => {
  process.exitCode = code;
});
