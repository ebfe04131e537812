/** Writes shared/records/test-record.schema.json from the zod schema: `npx tsx server/cli/write-record-schema.ts`. */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { jsonSchemaText } from '@shared/records/schema';

const target = fileURLToPath(new URL('../../shared/records/test-record.schema.json', import.meta.url));
writeFileSync(target, jsonSchemaText());
process.stdout.write(`wrote ${target}\n`);
