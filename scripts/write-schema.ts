// npm run schema: regenerate docs/section.schema.json from the zod schema.
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { sectionJsonSchema } from '../lib/section/json-schema';

const out = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../docs/section.schema.json');
fs.writeFileSync(out, JSON.stringify(sectionJsonSchema(), null, 2) + '\n');
console.error(`wrote ${out}`);
