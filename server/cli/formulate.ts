/**
 * Command line: `npm run -s formulate -- problem.json` (or `-` for standard input) prints
 * the result as JSON on standard output.
 *
 * The kind of problem is read from its shape (or forced with a flag):
 *   `mix` present → evaluation (--evaluate); `formulas` → allocation (--allocate);
 *   `problem` + `ingredient` → price sweep (--price-sweep); otherwise a single formula.
 * `--compact` prints one line instead of indented JSON.
 * Exit status: 0 solved (optimal, evaluated, swept), 2 infeasible or unbounded,
 * 1 invalid input, unreadable file or solver failure.
 */
import { readFileSync } from 'node:fs';

import { allocate } from '../../src/shared/engine/allocate';
import { evaluateMix } from '../../src/shared/engine/evaluate';
import { solveFormula } from '../../src/shared/engine/formulate';
import { priceSweep } from '../../src/shared/engine/price-sweep';
import { getHighsSolver } from '../lp/highs-solver';

const USAGE = 'usage: npm run -s formulate -- [--evaluate|--allocate|--price-sweep] [--compact] <problem.json | ->';

function fail(message: string): never {
  process.stderr.write(`${message}\n${USAGE}\n`);
  process.exit(1);
}

async function main() {
  const args = process.argv.slice(2);
  const flags = new Set(args.filter((a) => a.startsWith('--')));
  const files = args.filter((a) => !a.startsWith('--'));
  for (const f of flags) if (!['--evaluate', '--allocate', '--price-sweep', '--compact', '--help'].includes(f)) fail(`unknown option ${f}`);
  if (flags.has('--help')) {
    process.stdout.write(USAGE + '\n');
    return;
  }
  if (files.length !== 1) fail('give exactly one problem file, or - for standard input');
  let text: string;
  try {
    text = readFileSync(files[0] === '-' ? 0 : files[0], 'utf8');
  } catch (err) {
    fail(`cannot read ${files[0]}: ${(err as Error).message}`);
  }
  let input: unknown;
  try {
    input = JSON.parse(text);
  } catch (err) {
    fail(`${files[0]} is not valid JSON: ${(err as Error).message}`);
  }
  const obj = (input ?? {}) as Record<string, unknown>;
  const kind = flags.has('--evaluate') ? 'evaluate'
    : flags.has('--allocate') ? 'allocate'
    : flags.has('--price-sweep') ? 'sweep'
    : 'mix' in obj ? 'evaluate'
    : 'formulas' in obj ? 'allocate'
    : 'problem' in obj && 'ingredient' in obj ? 'sweep'
    : 'solve';

  let result: { status: string };
  if (kind === 'evaluate') result = evaluateMix(input);
  else if (kind === 'sweep') result = priceSweep(input);
  else if (kind === 'allocate') {
    result = allocate(input, { largeSolver: await getHighsSolver() });
  } else result = solveFormula(input);

  process.stdout.write(JSON.stringify(result, null, flags.has('--compact') ? undefined : 2) + '\n');
  const code = ['optimal', 'evaluated', 'swept'].includes(result.status) ? 0 : ['infeasible', 'unbounded'].includes(result.status) ? 2 : 1;
  process.exitCode = code;
}

main().catch((err: unknown) => {
  process.stderr.write(`formulate failed: ${(err as Error).stack ?? String(err)}\n`);
  process.exit(1);
});
