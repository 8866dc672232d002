// Runs every end-to-end spec in tests/e2e/specs (or those named in
// E2E_ONLY, comma-separated) and prints `tally: N passed, M failed`.
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = path.dirname(fileURLToPath(import.meta.url));
const only = (process.env.E2E_ONLY ?? '').split(',').filter(Boolean);
const files = fs.readdirSync(path.join(here, 'specs')).filter((f) => f.endsWith('.mjs')).sort()
  .filter((f) => only.length === 0 || only.some((o) => f.includes(o)));

let passed = 0;
let failed = 0;
for (const file of files) {
  const mod = await import(pathToFileURL(path.join(here, 'specs', file)).href);
  for (const [name, fn] of Object.entries(mod.tests ?? {})) {
    const t0 = Date.now();
    try {
      await fn();
      passed += 1;
      console.log(`ok   ${file} :: ${name} (${Date.now() - t0} ms)`);
    } catch (e) {
      failed += 1;
      console.log(`FAIL ${file} :: ${name} (${Date.now() - t0} ms)\n     ${String(e.stack ?? e).split('\n').slice(0, 6).join('\n     ')}`);
    }
  }
}
console.log(`tally: ${passed} passed, ${failed} failed`);
process.exit(failed === 0 ? 0 : 1);
