/** An element symbol as models take it ("Al", "Zn"; not "X", the unassigned vertex). */
import { z } from 'zod';
import { tryAtomicNumber } from '../structure/elements';

export const elementSymbolSchema = z
  .string()
  .refine((s) => tryAtomicNumber(s) !== undefined && tryAtomicNumber(s)! > 0, { message: 'unknown element symbol; write one such as Al, Pd or Mn' })
  .meta({ title: 'Element', description: 'Element symbol, e.g. Al.' });
