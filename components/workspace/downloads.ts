/**
 * Files from the current cut, written in the browser by lib/formats and handed to file-saver. Every structure file
 * goes through the export pipeline (lib/formats/write.ts exportFile): the cut is checked, repeated into the chosen
 * supercell, wrapped into its cell, and the check's warnings travel in the file's comment line. A cut with a severe
 * problem is downloaded only after the user confirms. A CIF carries the space group by default (see StructureFormat).
 * Files are written on the page's thread (the cut itself comes from the engine worker).
 */
import { saveAs } from 'file-saver';
import { create } from 'zustand';
import type { Structure } from '@/lib/structure/types';
import type { CheckReport } from '@/lib/structure/checks/report';
import type { SupercellSize } from '@/lib/structure/supercell';
import { exportFile, type WriteFormat } from '@/lib/formats/write';
import { initSymmetryAsync, spaceGroupOf, SYMMETRY_ATOM_LIMITS } from '@/lib/structure/symmetry';

/**
 * Every format the download menu offers (the formats we read, plus POSCAR and LAMMPS data). 'cif' is written with the
 * space group found (H-M symbol, number, operations, asymmetric unit) for cells up to SYMMETRY_ATOM_LIMITS.page atoms
 * and in P 1 above, saying so in a comment line; 'cif-p1' is the CIF in P 1 with every atom.
 */
export type StructureFormat = WriteFormat | 'cif-p1';

export const FORMAT_NAMES: Record<StructureFormat, string> = {
  xyz: 'XYZ',
  extxyz: 'Extended XYZ',
  cif: 'CIF (space group)',
  'cif-p1': 'CIF (P 1, all atoms)',
  json: 'JSON (Tauforge)',
  poscar: 'VASP POSCAR',
  lammps: 'LAMMPS data',
};

/** What lib/formats writes for a menu entry. */
function written(f: StructureFormat): { format: WriteFormat; cifSymmetry?: 'found' | 'p1' } {
  if (f === 'cif-p1') return { format: 'cif', cifSymmetry: 'p1' };
  if (f === 'cif') return { format: 'cif', cifSymmetry: 'found' };
  return { format: f };
}

/**
 * What the Check panel shares with the download menu and the save dialog: the latest report of the cut on screen
 * and the supercell chosen for downloads.
 */
interface ExportState {
  report: CheckReport | null;
  supercell: SupercellSize;
  setReport: (r: CheckReport | null) => void;
  setSupercell: (n: SupercellSize) => void;
}

export const useExportState = create<ExportState>((set) => ({
  report: null,
  supercell: [1, 1, 1],
  setReport: (report) => set({ report }),
  setSupercell: (supercell) => set({ supercell }),
}));

export function formatUnavailable(s: Structure, f: StructureFormat): string | null {
  if ((f === 'cif' || f === 'cif-p1') && !s.cell) return 'CIF needs a periodic cell; cut an approximant';
  if (f === 'poscar' && !s.cell) return 'POSCAR needs a periodic cell; cut an approximant';
  if (f === 'lammps' && !s.cell) return 'LAMMPS data needs a periodic cell; cut an approximant';
  return null;
}

/** The supercell applies to periodic cuts only; a finite patch is written as it is. */
function supercellFor(s: Structure): SupercellSize | undefined {
  const n = useExportState.getState().supercell;
  return s.cell && (n[0] !== 1 || n[1] !== 1 || n[2] !== 1) ? n : undefined;
}

/** The page's export pipeline: the space group (moyo) for the check and the CIF, up to the page's atom limit. */
function pageExport(s: Structure, f: StructureFormat, supercell: SupercellSize | undefined): { text: string; report: CheckReport } {
  const w = written(f);
  return exportFile(s, w.format, { supercell, cifSymmetry: w.cifSymmetry, spaceGroup: spaceGroupOf, symmetryMaxAtoms: SYMMETRY_ATOM_LIMITS.page });
}

/** The file text (the symmetry finder must be loaded first for a CIF with its space group: initSymmetryAsync). */
export function structureText(s: Structure, f: StructureFormat): string {
  return pageExport(s, f, supercellFor(s)).text;
}

export function slug(text: string): string {
  return text.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'model';
}

const EXTENSION: Record<StructureFormat, string> = { xyz: 'xyz', extxyz: 'extxyz', cif: 'cif', 'cif-p1': 'cif', json: 'json', poscar: 'vasp', lammps: 'lmp' };

export function fileName(base: string, f: StructureFormat, supercell?: SupercellSize): string {
  return `${slug(base)}${supercell ? `-${supercell.join('x')}` : ''}${f === 'cif-p1' ? '-p1' : ''}.${EXTENSION[f]}`;
}

export function saveText(text: string, name: string, mime = 'text/plain'): void {
  saveAs(new Blob([text], { type: `${mime};charset=utf-8` }), name);
}

/** The question asked before a cut with severe problems leaves the browser (null when there is none). */
export function severeQuestion(r: CheckReport | null, action: string): string | null {
  if (!r?.severe) return null;
  const lines = r.warnings.filter((w) => w.severity === 'severe').map((w) => `• ${w.message}`);
  return `The check found ${lines.length === 1 ? 'a severe problem' : `${lines.length} severe problems`} in this cut:\n\n${lines.join('\n')}\n\n${action} anyway? The warnings go into the file's comment line.`;
}

/**
 * Check, ask when something is severe, write and save. Errors (a mixed site in a POSCAR, a patch without a cell)
 * are shown to the user, never swallowed.
 */
export function saveStructure(s: Structure, f: StructureFormat, base: string): void {
  // The symmetry finder loads once per page (a small WebAssembly file); if it cannot, the CIF says P 1 and why.
  void initSymmetryAsync()
    .catch(() => undefined)
    .then(() => {
      const supercell = supercellFor(s);
      let out: { text: string; report: CheckReport };
      try {
        out = pageExport(s, f, supercell);
      } catch (e) {
        window.alert(`${FORMAT_NAMES[f]} cannot be written: ${(e as Error).message}`);
        return;
      }
      const q = severeQuestion(out.report, `Download the ${FORMAT_NAMES[f]} file`);
      if (q && !window.confirm(q)) return;
      const w = written(f).format;
      saveText(out.text, fileName(base, f, supercell), w === 'json' ? 'application/json' : w === 'cif' ? 'chemical/x-cif' : w === 'xyz' || w === 'extxyz' ? 'chemical/x-xyz' : 'text/plain');
    });
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
