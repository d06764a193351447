import { createRequire as __cr } from 'module'; const require = __cr(import.meta.url);
import "./chunk-LKYZCP33.js";

// dist/cli/io.js
import { readFileSync, writeFileSync, mkdirSync } from "node:fs";
import { dirname } from "node:path";
function processIo() {
  return {
    stdout: (t) => void process.stdout.write(t),
    stderr: (t) => void process.stderr.write(t),
    readFile: (p) => readFileSync(p, "utf8"),
    writeFile: (p, t) => {
      mkdirSync(dirname(p), { recursive: true });
      writeFileSync(p, t);
    },
    stdoutIsTTY: process.stdout.isTTY === true,
    stdinIsTTY: process.stdin.isTTY === true,
    env: process.env
  };
}
export {
  processIo
};
