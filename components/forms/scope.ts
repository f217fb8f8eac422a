/**
 * The values of the groups around a field, innermost last, for a field whose choices are other fields' values
 * (a cluster's site class is the name of one of the decoration's classes).
 */
import { createContext, useContext } from 'react';

export const EnclosingValues = createContext<readonly Record<string, unknown>[]>([]);

/** The `name`s of the entries of the nearest enclosing list called `key`. */
export function useNamesOf(key: string | undefined): string[] | undefined {
  const scopes = useContext(EnclosingValues);
  if (!key) return undefined;
  for (let i = scopes.length - 1; i >= 0; i--) {
    const list = scopes[i][key];
    if (Array.isArray(list)) return list.map((x) => (x && typeof x === 'object' ? (x as { name?: unknown }).name : undefined)).filter((n): n is string => typeof n === 'string' && n !== '');
  }
  return undefined;
}
