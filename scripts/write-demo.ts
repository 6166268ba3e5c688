// Writes the demo workbook to demo/ from the seeded generator in shared/demo.
// Run: npx tsx scripts/write-demo.ts (a test checks the committed file matches).
import { writeFileSync, mkdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { writeDemoWorkbook } from '../shared/demo/writeDemoWorkbook';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const out = path.join(root, 'demo', 'wrenhollow-n-trials-2025.xlsx');
mkdirSync(path.dirname(out), { recursive: true });
const bytes = await writeDemoWorkbook();
writeFileSync(out, bytes);
console.log(`wrote ${path.relative(root, out)} (${bytes.length} bytes)`);
