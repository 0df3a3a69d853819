/**
 * Runs every journey in tests/e2e/*.e2e.ts against one real server and one Chromium, and ends
 * with the line "e2e: N passed, M failed". Exit status 1 if any failed.
 */
import fs from 'node:fs';
import path from 'node:path';
import { startHarness, type Harness } from './harness';

interface Journey {
  name: string;
  run(h: Harness): Promise<void>;
}

async function main() {
  const files = fs.readdirSync(__dirname).filter((f) => f.endsWith('.e2e.ts')).sort();
  const only = process.argv[2];
  const journeys: Journey[] = [];
  for (const f of files) {
    const mod = (await import(path.join(__dirname, f))) as { journeys: Journey[] };
    journeys.push(...mod.journeys.filter((j) => !only || j.name.includes(only) || f.includes(only)));
  }
  const h = await startHarness();
  let passed = 0;
  let failed = 0;
  try {
    for (const j of journeys) {
      const t0 = Date.now();
      try {
        await j.run(h);
        passed++;
        console.log(`  ✓ ${j.name} (${Date.now() - t0} ms)`);
      } catch (err) {
        failed++;
        console.log(`  ✗ ${j.name}\n    ${(err as Error).message.split('\n').join('\n    ')}`);
      }
    }
  } finally {
    await h.close();
  }
  console.log(`e2e: ${passed} passed, ${failed} failed`);
  process.exit(failed > 0 || passed === 0 ? 1 : 0);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
