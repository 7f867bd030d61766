/**
 * npm run check -- layout.json [--strict]
 *
 * Checks a layout file against the demo families and catalog and prints { findings, settings }
 * as JSON. Exit codes: 0 checked; 1 bad input (each problem named by its field path on
 * stderr); 2 cannot read the file or it is not JSON; 3 with --strict when a finding blocks fit.
 */
import { readFileSync } from 'node:fs';
import { checkLayoutInput, demoCatalog, demoFamilies, indexCatalog } from '../src/lib/domain/index';

function main(argv: string[]): number {
  const args = argv.filter((a) => !a.startsWith('--'));
  const strict = argv.includes('--strict');
  if (args.length !== 1) {
    process.stderr.write('usage: npm run check -- <layout.json> [--strict]\n');
    return 2;
  }
  const file = args[0]!;
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    process.stderr.write(`cannot read ${file}: ${(e as Error).message}\n`);
    return 2;
  }
  let input: unknown;
  try {
    input = JSON.parse(text);
  } catch (e) {
    process.stderr.write(`${file} is not JSON: ${(e as Error).message}\n`);
    return 2;
  }
  const result = checkLayoutInput(input, demoFamilies, indexCatalog(demoCatalog));
  if (!result.ok) {
    process.stderr.write(`${file}: invalid layout\n`);
    for (const p of result.problems) process.stderr.write(`  ${p.path || '(document)'}: ${p.message}\n`);
    return 1;
  }
  process.stdout.write(`${JSON.stringify({ findings: result.findings, settings: result.settings }, null, 2)}\n`);
  return strict && result.findings.some((f) => f.severity === 'blocks-fit') ? 3 : 0;
}

try {
  process.exitCode = main(process.argv.slice(2));
} catch (e) {
  process.stderr.write(`check failed: ${(e as Error).message}\n`);
  process.exitCode = 2;
}
