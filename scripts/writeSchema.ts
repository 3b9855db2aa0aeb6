/**
 * `npm run schema`: writes assets/scenario.schema.json from the zod schema the app validates with.
 * Run it after any change to src/core/scenario/schema.ts and commit the result; a test
 * (tests/demos/schema.test.ts) fails when the committed file is out of date.
 */
import { writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { scenarioJsonSchemaText } from '../src/core/scenario/jsonSchema';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const out = join(root, 'assets', 'scenario.schema.json');
writeFileSync(out, scenarioJsonSchemaText());
process.stdout.write(`wrote ${out}\n`);
