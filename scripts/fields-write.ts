// Writes the vehicle page's field tree, as read from its rules in schema.ts, to fieldTree.data.ts,
// so the browser gets the tree as plain data. Run `npm run fields:write` after changing a field.
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { fieldTree } from '../src/lib/domain/content/fieldRules';
import { fieldTreeModule } from '../src/lib/domain/content/fieldTreeSource';
import { vehicleContentSchema } from '../src/lib/domain/content/schema';

const target = fileURLToPath(new URL('../src/lib/domain/content/fieldTree.data.ts', import.meta.url));
writeFileSync(target, fieldTreeModule(fieldTree(vehicleContentSchema).top));
console.log(`Wrote ${target}`);
