/** `bellstep schema`: print the JSON Schema of a file kind, for editors and tools. */
import { InputError } from '../../model/errors.js';
import { noiseJsonSchema, programSetJsonSchema } from '../../model/index.js';
import { didYouMean } from '../../model/suggest.js';
import { EXIT, type CommandSpec } from '../spec.js';

const SCHEMAS: Readonly<Record<string, () => Record<string, unknown>>> = {
  'program-set': programSetJsonSchema,
  noise: noiseJsonSchema,
};

export const schemaCommand: CommandSpec = {
  name: 'schema',
  args: '<NAME>',
  summary: 'print the JSON Schema of a file kind: program-set or noise',
  options: [],
  async run({ io }, [name]) {
    if (!Object.hasOwn(SCHEMAS, name)) {
      const names = Object.keys(SCHEMAS);
      throw new InputError({
        code: 'usage',
        message: `unknown schema "${name}"${didYouMean(name, names)}; the schemas are ${names.map((n) => `"${n}"`).join(' and ')}`,
        fix: `run "bellstep schema ${names[0]}" or "bellstep schema ${names[1]}"`,
      });
    }
    io.stdout(`${JSON.stringify(SCHEMAS[name](), null, 2)}\n`);
    return EXIT.ok;
  },
};
