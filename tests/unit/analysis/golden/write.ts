/**
 * Writes results.json: the engine's full result (every number, curves included) for each golden
 * case. Run only when a result is meant to change, and say why in the commit:
 *   npx tsx tests/unit/analysis/golden/write.ts
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { GOLDEN_CASES } from './cases';

const results: Record<string, unknown> = {};
for (const golden of GOLDEN_CASES) results[golden.name] = golden.run();
writeFileSync(fileURLToPath(new URL('./results.json', import.meta.url)), `${JSON.stringify(results)}\n`);
console.log(`wrote ${GOLDEN_CASES.length} results`);
