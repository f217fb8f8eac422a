// Types for the helpers next.config.mjs exports beside the config (used by the tests).
import type { NextConfig } from 'next';

export function apiMethodTable(dir?: string): [string, string[]][];
export const securityHeaders: { key: string; value: string }[];
declare const nextConfig: NextConfig;
export default nextConfig;
