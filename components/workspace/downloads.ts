/** Files from the current cut, written in the browser by lib/formats and handed to file-saver. */
import { saveAs } from 'file-saver';
import type { Structure } from '@/lib/structure/types';
import { writeStructure } from '@/lib/formats/write';
import type { StructureFormat } from '@/lib/formats/read';

export type { StructureFormat };

export const FORMAT_NAMES: Record<StructureFormat, string> = {
  xyz: 'XYZ',
  extxyz: 'Extended XYZ',
  cif: 'CIF',
  json: 'JSON (Tauforge)',
};

export function formatUnavailable(s: Structure, f: StructureFormat): string | null {
  if (f === 'cif' && !s.cell) return 'CIF needs a periodic cell; cut an approximant';
  return null;
}

export function structureText(s: Structure, f: StructureFormat): string {
  return writeStructure(s, f);
}

export function slug(text: string): string {
  return text.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'model';
}

export function fileName(base: string, f: StructureFormat): string {
  return `${slug(base)}.${f === 'extxyz' ? 'extxyz' : f}`;
}

export function saveText(text: string, name: string, mime = 'text/plain'): void {
  saveAs(new Blob([text], { type: `${mime};charset=utf-8` }), name);
}

export function saveStructure(s: Structure, f: StructureFormat, base: string): void {
  saveText(structureText(s, f), fileName(base, f), f === 'json' ? 'application/json' : f === 'cif' ? 'chemical/x-cif' : 'chemical/x-xyz');
}

export function saveCanvasPng(canvas: HTMLCanvasElement, name: string): void {
  canvas.toBlob((b) => b && saveAs(b, name), 'image/png');
}

/** An SVG element rendered to PNG at 2× for sharp figures. */
export async function saveSvgPng(svg: SVGSVGElement, name: string): Promise<void> {
  const xml = new XMLSerializer().serializeToString(svg);
  const box = svg.getBoundingClientRect();
  const img = new Image();
  const url = URL.createObjectURL(new Blob([xml], { type: 'image/svg+xml' }));
  await new Promise<void>((resolve, reject) => {
    img.onload = () => resolve();
    img.onerror = () => reject(new Error('could not render the picture'));
    img.src = url;
  });
  const c = document.createElement('canvas');
  c.width = Math.round(box.width * 2);
  c.height = Math.round(box.height * 2);
  const g = c.getContext('2d')!;
  g.fillStyle = '#fffdf8';
  g.fillRect(0, 0, c.width, c.height);
  g.drawImage(img, 0, 0, c.width, c.height);
  URL.revokeObjectURL(url);
  saveCanvasPng(c, name);
}

export function csv(rows: (string | number | undefined)[][]): string {
  return rows.map((r) => r.map((v) => (v === undefined ? '' : typeof v === 'number' ? String(v) : /[",\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v)).join(',')).join('\n') + '\n';
}
