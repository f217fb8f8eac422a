#!/usr/bin/python3
"""Published α-(AlMnSi) against Tauforge's Mackay 1/1 (issue #10).

Published structure, read (not recalled) from COD entry 2007194:
  Sugiyama, Kaji & Hiraga, "Re-refinement of α-(AlMnSi)", Acta Cryst. C54 (1998) 445-447,
  doi:10.1107/S0108270197015989. Pm-3 (No. 200), a = 12.6430(10) Å, Z = 24 of Al4Mn1.01Si0.74, 138 sites.

Usage: /usr/bin/python3 scripts/checks/alpha_almnsi.py [tauforge.cif]
  Without an argument: the published cell only (space group, count, shells about both cluster centres).
  With a Tauforge CIF (P 1, e.g. `npm run -s cli -- approximant --family icosahedral --order 1/1 --preset mackay
  --aR 4.606 --format cif --cif-symmetry p1`): which published sites the model reproduces and which it lacks.
"""
import json
import sys

import numpy as np
import spglib
from ase.spacegroup import crystal

A_PUB = 12.6430
# label, Wyckoff (Pm-3), x, y, z, occupancy as published (species -> fraction)
SITES = [
    ('Mn1', '12j', 0.32631, 0.19779, 0.0, {'Mn': 1.0}),
    ('Mn2', '12k', 0.17925, 0.30790, 0.5, {'Mn': 1.0}),
    ('Al1', '6e', 0.36784, 0.0, 0.0, {'Al': 1.0}),
    ('Al2', '6h', 0.12429, 0.5, 0.5, {'Al': 1.0}),
    ('Si3', '6f', 0.28966, 0.0, 0.5, {'Si': 0.99, 'Al': 0.01}),
    ('Al4', '12j', 0.16552, 0.10141, 0.0, {'Al': 0.65, 'Si': 0.35}),
    ('Si5', '12k', 0.33611, 0.40026, 0.5, {'Si': 0.63, 'Al': 0.37}),
    ('Al6', '12j', 0.33135, 0.40206, 0.0, {'Al': 1.0}),
    ('Al7', '12k', 0.12387, 0.11768, 0.5, {'Al': 1.0}),
    ('Al8', '24l', 0.11798, 0.18860, 0.29906, {'Al': 1.0}),
    ('Al9', '24l', 0.39074, 0.31291, 0.19617, {'Al': 1.0}),
]


def published(a=A_PUB):
    major = [max(occ, key=occ.get) for *_, occ in SITES]
    at = crystal(major, basis=[s[2:5] for s in SITES], spacegroup=200, cellpar=[a, a, a, 90, 90, 90])
    # ase puts the basis index into 'spacegroup_kinds'
    kinds = at.get_array('spacegroup_kinds')
    return at, [SITES[k][0] for k in kinds]


def shells(frac, labels, a, centre, rmax=8.0):
    """Atoms within rmax of a centre (fractional), grouped by (label, rounded radius)."""
    out = {}
    for f, lab in zip(frac, labels):
        d = (f - centre + 0.5) % 1.0 - 0.5
        r = float(np.linalg.norm(d) * a)
        if r < rmax:
            key = (lab, round(r, 2))
            out[key] = out.get(key, 0) + 1
    return sorted(([lab, r, n] for (lab, r), n in out.items()), key=lambda t: t[1])


def read_p1_cif(path):
    cell, rows, in_loop, cols = {}, [], False, []
    for line in open(path):
        t = line.split()
        if not t or t[0].startswith('#'):
            continue
        if t[0].startswith('_cell_length_'):
            cell[t[0][-1]] = float(t[1])
        if t[0] == 'loop_':
            in_loop, cols = True, []
            continue
        if in_loop and t[0].startswith('_'):
            cols.append(t[0])
            continue
        if in_loop and '_atom_site_fract_x' in cols and len(t) == len(cols):
            rows.append(t)
        elif in_loop and not t[0].startswith('_'):
            pass
    ix = cols.index('_atom_site_fract_x')
    it = cols.index('_atom_site_type_symbol')
    frac = np.array([[float(r[ix]), float(r[ix + 1]), float(r[ix + 2])] for r in rows]) % 1.0
    return cell['a'], frac, [r[it] for r in rows]


def match(model_frac, pub_frac, pub_labels, a):
    """Nearest published site (Å, published a) for every model atom, and nearest model atom for every published site."""
    d = (model_frac[:, None, :] - pub_frac[None, :, :] + 0.5) % 1.0 - 0.5
    dist = np.linalg.norm(d, axis=2) * a
    return dist.min(axis=1), dist.argmin(axis=1), dist.min(axis=0)


def main():
    at, labels = published()
    frac = at.get_scaled_positions() % 1.0
    ds = spglib.get_symmetry_dataset((at.cell[:], frac, at.numbers), symprec=1e-3)
    sg = ds.international if hasattr(ds, 'international') else ds['international']
    num = ds.number if hasattr(ds, 'number') else ds['number']
    report = {
        'published': {
            'source': 'Sugiyama, Kaji & Hiraga, Acta Cryst. C54 (1998) 445 (COD 2007194)',
            'a': A_PUB, 'atoms': len(at), 'spglib': f'{sg} ({num})',
            'density_atoms_per_A3': len(at) / A_PUB**3,
            'about_origin': shells(frac, labels, A_PUB, np.zeros(3)),
            'about_body_centre': shells(frac, labels, A_PUB, np.full(3, 0.5)),
        }
    }
    # Pseudo-I-centring: each published site moved by (1/2, 1/2, 1/2), and the nearest published atom to it. An Im-3
    # cut (our 1/1) has every site together with that image, so a site whose image lands on nothing or too close
    # to another atom cannot be carried by it.
    cart = frac * A_PUB
    icen = {}
    for k, lab in enumerate(labels):
        if lab in icen:
            continue
        img = (frac[k] + 0.5) % 1.0
        d = np.linalg.norm(((frac - img + 0.5) % 1.0 - 0.5) * A_PUB, axis=1)
        j = int(d.argmin())
        icen[lab] = [labels[j], round(float(d[j]), 2)]
    report['published']['body_centred_image_nearest_site'] = icen
    # Glue: distance to the two cluster centres and to the three-fold axis joining them (the b-linkage).
    glue = {}
    for k, lab in enumerate(labels):
        if lab not in ('Si3', 'Al6', 'Al7') or lab in glue:
            continue
        best = None
        for c0 in np.array([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1], [1, 1, 0], [1, 0, 1], [0, 1, 1], [1, 1, 1]], float):
            for s in np.array([[1, 1, 1], [1, 1, -1], [1, -1, 1], [-1, 1, 1], [-1, -1, 1], [-1, 1, -1], [1, -1, -1], [-1, -1, -1]], float):
                c1 = c0 + 0.5 * s
                r0 = np.linalg.norm((frac[k] - c0) * A_PUB)
                r1 = np.linalg.norm((frac[k] - c1) * A_PUB)
                if best is None or r0 + r1 < best[0] + best[1]:
                    ax = (c1 - c0) / np.linalg.norm(c1 - c0)
                    v = (frac[k] - c0) * A_PUB
                    off = float(np.linalg.norm(v - np.dot(v, ax) * ax))
                    best = (float(r0), float(r1), off, float(np.dot(v, ax)))
        glue[lab] = {'to_origin_type_centre': round(best[0], 2), 'to_body_type_centre': round(best[1], 2),
                     'off_3fold_axis': round(best[2], 2), 'along_axis_from_origin_centre': round(best[3], 2)}
    report['published']['glue_geometry'] = glue
    if len(sys.argv) > 1:
        a_m, mfrac, msp = read_p1_cif(sys.argv[1])
        res = {'a': a_m, 'atoms': len(mfrac)}
        # The model's cubic axes can be the published ones or their x<->y mirror (the two orientations of an
        # icosahedron in m-3); try both and keep the one that matches better.
        best = None
        for name, perm in (('as published', [0, 1, 2]), ('x<->y', [1, 0, 2])):
            pf = frac[:, perm]
            dmin, arg, back = match(mfrac, pf, labels, A_PUB)
            score = float(np.median(dmin))
            if best is None or score < best[0]:
                best = (score, name, dmin, arg, back)
        _, setting, dmin, arg, back = best
        res['setting'] = setting
        per_model = {}
        for i, (dm, k) in enumerate(zip(dmin, arg)):
            per_model.setdefault(labels[k], []).append(float(dm))
        res['model_atoms_by_nearest_published_site'] = {
            k: {'n': len(v), 'max_dist': round(max(v), 3), 'mean_dist': round(float(np.mean(v)), 3)} for k, v in sorted(per_model.items())
        }
        missing = {}
        for k, lab in enumerate(labels):
            if back[k] > 0.8:
                missing.setdefault(lab, []).append(float(back[k]))
        res['published_sites_without_model_atom_within_0.8A'] = {
            k: {'n': len(v), 'nearest_model_atom_A': [round(min(v), 2), round(max(v), 2)]} for k, v in sorted(missing.items())
        }
        res['density_ratio_model_over_published'] = (len(mfrac) / a_m**3) / (len(at) / A_PUB**3)
        report['model'] = res
    json.dump(report, sys.stdout, indent=1)
    print()


if __name__ == '__main__':
    main()
