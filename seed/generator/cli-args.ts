/**
 * Command-line flags of `seed/generate.ts`: `--flag value` or `--flag=value`, each at most once.
 * Throws {@link CliUsageError} naming the flag and value at fault.
 */
import type { GalaxyOptions } from './options';

export const USAGE =
  'usage: npx tsx seed/generate.ts --out DIR [--seed N] ' +
  '[--complexes N] [--interlopers N] [--scale X] | [--rows N]';

const NUMERIC_FLAGS = ['seed', 'complexes', 'interlopers', 'scale', 'rows'] as const;
type NumericFlag = (typeof NUMERIC_FLAGS)[number];

/** A bad command line; the message names the flag and the value. */
export class CliUsageError extends Error {}

/** Reads the flags (argv without the node and script paths); --out is required, --seed defaults to 7. */
export function parseCliArgs(argv: string[]): { out: string; options: GalaxyOptions } {
  const values = new Map<string, string>();
  for (let k = 0; k < argv.length; k++) {
    const arg = argv[k];
    if (!arg.startsWith('--'))
      throw new CliUsageError(`unexpected argument ${JSON.stringify(arg)}`);
    const eq = arg.indexOf('=');
    const flag = eq >= 0 ? arg.slice(2, eq) : arg.slice(2);
    if (flag !== 'out' && !(NUMERIC_FLAGS as readonly string[]).includes(flag)) {
      throw new CliUsageError(`unknown flag --${flag}`);
    }
    if (values.has(flag)) throw new CliUsageError(`flag --${flag} given twice`);
    const value = eq >= 0 ? arg.slice(eq + 1) : argv[++k];
    if (value === undefined || value === '')
      throw new CliUsageError(`flag --${flag} needs a value`);
    values.set(flag, value);
  }
  const out = values.get('out');
  if (out === undefined) throw new CliUsageError('flag --out DIR is required');
  const num = (flag: NumericFlag): number | undefined => {
    const text = values.get(flag);
    if (text === undefined) return undefined;
    const n = Number(text);
    if (text.trim() === '' || !Number.isFinite(n)) {
      throw new CliUsageError(`flag --${flag}: ${JSON.stringify(text)} is not a number`);
    }
    return n;
  };
  return {
    out,
    options: {
      seed: num('seed') ?? 7,
      complexes: num('complexes'),
      interlopers: num('interlopers'),
      scale: num('scale'),
      rows: num('rows'),
    },
  };
}
