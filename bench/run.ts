/**
 * `npm run bench` — prints Plumbline's speed figures as a table, targets beside them.
 *   --quick          one run each, small batches (what CI runs; not a measurement)
 *   --json FILE      also write {"machine": {...}, "figures": [...]} to FILE
 *   --only A[,B…]    only the figures whose names start with A, B … (e.g. --only tyre.eval,solve,rose);
 *                    a scene runs only when one of its figures is wanted
 * Progress goes to stderr, the table to stdout.
 */
import { writeFileSync } from 'node:fs';
import { FIGURE_NAMES, report, runBench } from './bench';

function usage(): never {
  process.stderr.write('usage: npm run bench -- [--quick] [--json FILE] [--only NAME[,NAME…]]\n');
  process.exit(2);
}

async function main(): Promise<void> {
  const argv = process.argv.slice(2);
  let quick = false;
  let jsonPath: string | null = null;
  const only: string[] = [];
  const addOnly = (list: string | undefined) => {
    const names = (list ?? '').split(',').map((x) => x.trim()).filter((x) => x.length > 0);
    if (names.length === 0) usage();
    only.push(...names);
  };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--quick') quick = true;
    else if (a === '--json') {
      const next = argv[++i];
      if (!next || next.startsWith('--')) usage();
      jsonPath = next;
    } else if (a.startsWith('--json=')) jsonPath = a.slice('--json='.length);
    else if (a === '--only') addOnly(argv[++i]);
    else if (a.startsWith('--only=')) addOnly(a.slice('--only='.length));
    else if (a === '--help' || a === '-h') usage();
    else {
      process.stderr.write(`bench: unknown argument ${a}\n`);
      usage();
    }
  }
  const r = await runBench({ quick, only, log: (line) => process.stderr.write(`  ${line}\n`) });
  if (only.length > 0 && r.figures.length === 0) {
    process.stderr.write(`bench: --only ${only.join(',')} names no figure (names: ${FIGURE_NAMES.join(', ')} …)\n`);
    process.exit(2);
  }
  process.stdout.write(`${report(r)}\n`);
  if (jsonPath) {
    const { machine, figures } = r;
    writeFileSync(jsonPath, `${JSON.stringify({ machine, quick, figures }, null, 2)}\n`);
    process.stderr.write(`bench: figures written to ${jsonPath}\n`);
  }
}

main().catch((e: unknown) => {
  process.stderr.write(`bench: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
  process.exit(1);
});
