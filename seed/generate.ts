/**
 * Command line for the demo-scenario generator: writes the four survey files and the truth into
 * a directory and prints a JSON summary on stdout.
 *
 *   npx tsx seed/generate.ts --out DIR [--seed 7] [--complexes 300] [--interlopers 200] [--scale N]
 *   npx tsx seed/generate.ts --out DIR [--seed 7] --rows 2000000
 *
 * --rows sets the total number of rows over the four catalogs (for benchmarks) and excludes
 * --complexes, --interlopers and --scale. Bad flags exit with status 2 and a message naming the
 * flag and value.
 */
import { resolve } from 'node:path';
import { generateGalaxy, GeneratorOptionError, writeDemoFiles } from './generator';
import { CliUsageError, parseCliArgs, USAGE } from './generator/cli-args';

async function main(): Promise<void> {
  let parsed: ReturnType<typeof parseCliArgs>;
  try {
    parsed = parseCliArgs(process.argv.slice(2));
  } catch (err) {
    if (!(err instanceof CliUsageError)) throw err;
    process.stderr.write(`error: ${err.message}\n${USAGE}\n`);
    process.exit(2);
  }
  const t0 = performance.now();
  let galaxy: ReturnType<typeof generateGalaxy>;
  try {
    galaxy = generateGalaxy(parsed.options);
  } catch (err) {
    if (!(err instanceof GeneratorOptionError)) throw err;
    process.stderr.write(`error: ${err.message}\n${USAGE}\n`);
    process.exit(2);
  }
  const t1 = performance.now();
  const written = await writeDemoFiles(galaxy, resolve(parsed.out));
  const t2 = performance.now();
  const { truth } = galaxy;
  const summary = {
    seed: truth.seed,
    counts: truth.counts,
    corotationKpc: truth.corotationKpc,
    patternSpeedKmsKpc: truth.patternSpeedKmsKpc,
    rotationCurve: { R0Kpc: truth.rotationCurve.R0Kpc, theta0Kms: truth.rotationCurve.theta0Kms },
    youngMinusGasPerpKpcInside: truth.ordering.youngMinusGasPerpKpcInside,
    effectiveTimescaleMyr: truth.ordering.effectiveTimescaleMyr,
    arms: truth.arms.map((a) => a.name),
    files: written,
    elapsedMs: { generate: Math.round(t1 - t0), write: Math.round(t2 - t1) },
  };
  process.stdout.write(JSON.stringify(summary, null, 2) + '\n');
}

main().catch((err: unknown) => {
  process.stderr.write(
    `error: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`,
  );
  process.exit(1);
});
