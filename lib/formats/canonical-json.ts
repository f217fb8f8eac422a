/**
 * The one canonical JSON of the project: RFC 8785 (JSON Canonicalization Scheme) through the
 * `canonicalize` package — keys sorted by UTF-16 code units, numbers as ECMAScript writes them,
 * undefined members dropped, NaN and Infinity refused. Used for the params written into every file's
 * provenance and for every params hash, so the two can never disagree.
 */
import canonicalize from 'canonicalize';

export function canonicalJson(value: unknown): string {
  return canonicalize(value ?? null) ?? 'null';
}
