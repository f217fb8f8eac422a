/** Flag parsing shared by the CLI command families: commander hands us strings, we hand back typed values. */
import type { ZodType } from 'zod';
import { CliError, zodMessage } from './errors';
import type { Structure } from '../../lib/structure/types';
import { writeStructure } from '../../lib/formats/write';
import type { StructureFormat } from '../../lib/formats/read';

export function parse<T>(schema: ZodType<T>, input: unknown): T {
  const r = schema.safeParse(input);
  if (!r.success) throw new CliError(zodMessage(r.error));
  return r.data;
}

/** A flag that must be a number. */
export function num(flag: string, v: string | undefined): number | undefined {
  if (v === undefined) return undefined;
  const x = Number(v);
  if (v.trim() === '' || !Number.isFinite(x)) throw new CliError(`${flag}: "${v}" is not a number`);
  return x;
}

/** A flag holding three numbers x,y,z. */
export function vec(flag: string, v: string | undefined): number[] | undefined {
  if (v === undefined) return undefined;
  const parts = v.split(',');
  if (parts.length !== 3) throw new CliError(`${flag}: expected three numbers x,y,z, got "${v}"`);
  return parts.map((p) => num(flag, p)!);
}

export function format<F extends string>(v: string, allowed: readonly F[]): F {
  if (!(allowed as readonly string[]).includes(v)) throw new CliError(`--format: must be one of ${allowed.join(', ')}, got "${v}"`);
  return v as F;
}

/** Generators throw RangeError naming the field (e.g. the point cap); that is a user error here. */
export function run(make: () => Structure): Structure {
  try {
    return make();
  } catch (err) {
    if (err instanceof RangeError) throw new CliError(err.message);
    throw err;
  }
}

/** Write a structure to stdout in one of the coordinate formats, ending with a newline. */
export function emit(s: Structure, fmt: StructureFormat): void {
  const text = writeStructure(s, fmt);
  process.stdout.write(text.endsWith('\n') ? text : text + '\n');
}
