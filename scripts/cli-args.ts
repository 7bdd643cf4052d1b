/**
 * Arguments for the command-line scripts, one way for all of them (node:util's parseArgs, strict): `--help`
 * prints the usage and exits 0; an unknown option or a stray argument exits 2 with one sentence, so no file is
 * ever named after an option.
 */
import { parseArgs, type ParseArgsConfig } from 'node:util';

export function cliArgs<O extends NonNullable<ParseArgsConfig['options']>>(help: string, options: O, maxPositionals: number) {
  let parsed;
  try {
    parsed = parseArgs({ options: { ...options, help: { type: 'boolean', default: false } }, allowPositionals: true, strict: true });
  } catch (e) {
    process.stderr.write(`${(e as Error).message}. Run with --help for the options.\n`);
    process.exit(2);
  }
  if ((parsed.values as { help?: boolean }).help) {
    process.stdout.write(`${help}\n`);
    process.exit(0);
  }
  if (parsed.positionals.length > maxPositionals) {
    process.stderr.write(`Unexpected argument "${parsed.positionals[maxPositionals]}". Run with --help for the usage.\n`);
    process.exit(2);
  }
  return parsed;
}
