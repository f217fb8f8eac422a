'use client';
/**
 * The drawn layers: atoms (impostors, one draw call per species), the naive sphere meshes kept for the
 * benchmark, pick marks, bonds and cell edges. Each builds its GPU buffers once per input and disposes them.
 */
import { useEffect, useMemo } from 'react';
import * as THREE from 'three';
import type { Cell } from '@/lib/structure/types';
import { bondPairs } from '@/lib/view/bonds';
import { speciesRadius } from '@/lib/view/palette';
import {
  createBondGeometry,
  createBondMaterial,
  createImpostorGeometry,
  createImpostorMaterial,
  setUniform,
  type ClipUniforms,
} from './impostorMaterial';
import type { SpeciesBatch } from './sceneData';

/** Free GPU resources when a memoised three.js object is replaced or unmounted. */
function useDispose(...objects: { dispose(): void }[]): void {
  useEffect(() => () => objects.forEach((o) => o.dispose()), objects); // eslint-disable-line react-hooks/exhaustive-deps
}

function SpeciesImpostors({ batch, clip, radiusScale, instanced }: { batch: SpeciesBatch; clip: ClipUniforms; radiusScale: number; instanced: boolean }) {
  const geometry = useMemo(() => createImpostorGeometry(batch.centres, instanced), [batch, instanced]);
  const material = useMemo(() => createImpostorMaterial(clip, batch.colour, 1), [clip, batch.colour]);
  useDispose(geometry, material);
  useEffect(() => setUniform(material, 'radius', speciesRadius(batch.z, radiusScale)), [material, batch.z, radiusScale]);
  return <mesh geometry={geometry} material={material} frustumCulled={false} name={`atoms-${batch.z}`} />;
}

/** Sphere impostors: one geometry and one draw call per species (instanced, or written-out quads). */
export function ImpostorAtoms({ batches, clip, radiusScale, instanced = false }: { batches: SpeciesBatch[]; clip: ClipUniforms; radiusScale: number; instanced?: boolean }) {
  return (
    <>
      {batches.map((b) => (
        <SpeciesImpostors key={b.z} batch={b} clip={clip} radiusScale={radiusScale} instanced={instanced} />
      ))}
    </>
  );
}

/** 168 triangles per sphere: SphereGeometry(1, 12, 8) has 2·12·(8 − 1) faces. */
export const NAIVE_SPHERE_SEGMENTS: [number, number] = [12, 8];

function SpeciesSpheres({ batch, radiusScale }: { batch: SpeciesBatch; radiusScale: number }) {
  const geometry = useMemo(() => new THREE.SphereGeometry(1, ...NAIVE_SPHERE_SEGMENTS), []);
  const material = useMemo(() => new THREE.MeshLambertMaterial({ color: batch.colour }), [batch.colour]);
  const mesh = useMemo(() => {
    const n = batch.indices.length;
    const m = new THREE.InstancedMesh(geometry, material, n);
    const r = speciesRadius(batch.z, radiusScale);
    const t = new THREE.Matrix4();
    for (let k = 0; k < n; k++) {
      t.makeScale(r, r, r).setPosition(batch.centres[3 * k], batch.centres[3 * k + 1], batch.centres[3 * k + 2]);
      m.setMatrixAt(k, t);
    }
    m.frustumCulled = false;
    return m;
  }, [batch, geometry, material, radiusScale]);
  useDispose(geometry, material, mesh);
  return <primitive object={mesh} />;
}

/**
 * The naive reference for the benchmark: a real triangulated sphere per atom through InstancedMesh.
 * It ignores the slab and the cluster.
 */
export function NaiveAtoms({ batches, radiusScale }: { batches: SpeciesBatch[]; radiusScale: number }) {
  return (
    <>
      <ambientLight intensity={0.9} />
      <directionalLight position={[-3, 4, 5]} intensity={2} />
      {batches.map((b) => (
        <SpeciesSpheres key={b.z} batch={b} radiusScale={radiusScale} />
      ))}
    </>
  );
}

/** Picked atoms: a translucent brass shell around each, obeying the same slab and cluster. */
export function PickMarks({ positions, picks, radii, clip }: { positions: Float64Array; picks: number[]; radii: Float32Array; clip: ClipUniforms }) {
  return (
    <>
      {picks.map((i, k) => (
        <PickMark key={`${i}-${k}`} centre={[positions[3 * i], positions[3 * i + 1], positions[3 * i + 2]]} radius={radii[i] * 1.3 + 0.1} clip={clip} last={k === picks.length - 1} />
      ))}
    </>
  );
}

function PickMark({ centre, radius, clip, last }: { centre: [number, number, number]; radius: number; clip: ClipUniforms; last: boolean }) {
  const [x, y, z] = centre;
  const geometry = useMemo(() => createImpostorGeometry(new Float32Array([x, y, z])), [x, y, z]);
  const material = useMemo(() => createImpostorMaterial(clip, last ? '#b8862b' : '#0e6f6a', radius, 0.45), [clip, radius, last]);
  useDispose(geometry, material);
  return <mesh geometry={geometry} material={material} frustumCulled={false} renderOrder={10} />;
}

/** Bonds under the cut-off (the shared cell list, lib/math/cell-list.ts), drawn as instanced tubes in one draw call. */
export function Bonds({ positions, cutoff, clip, maxBonds = 400_000, onCount }: { positions: Float64Array; cutoff: number; clip: ClipUniforms; maxBonds?: number; onCount?: (n: number, truncated: boolean) => void }) {
  const list = useMemo(() => bondPairs(positions, cutoff, { maxBonds }), [positions, cutoff, maxBonds]);
  useEffect(() => onCount?.(list.pairs.length / 2, list.truncated), [list, onCount]);
  const geometry = useMemo(() => {
    const m = list.pairs.length / 2;
    const s = new Float32Array(3 * m);
    const e = new Float32Array(3 * m);
    for (let k = 0; k < m; k++) {
      const i = list.pairs[2 * k];
      const j = list.pairs[2 * k + 1];
      s.set([positions[3 * i], positions[3 * i + 1], positions[3 * i + 2]], 3 * k);
      e.set([positions[3 * j], positions[3 * j + 1], positions[3 * j + 2]], 3 * k);
    }
    return createBondGeometry(s, e);
  }, [list, positions]);
  const material = useMemo(() => createBondMaterial(clip, '#8d8a80', 0.12), [clip]);
  useDispose(geometry, material);
  if (list.pairs.length === 0) return null;
  return <mesh geometry={geometry} material={material} frustumCulled={false} name="bonds" />;
}

/** The twelve edges of the periodic cell, from the origin. */
export function CellEdges({ cell }: { cell: Cell }) {
  const geometry = useMemo(() => {
    const [a, b, c] = cell.map((v) => new THREE.Vector3(...v));
    const o = new THREE.Vector3();
    const corners = [o, a, b, c, a.clone().add(b), a.clone().add(c), b.clone().add(c), a.clone().add(b).add(c)];
    const edges = [[0, 1], [0, 2], [0, 3], [1, 4], [1, 5], [2, 4], [2, 6], [3, 5], [3, 6], [4, 7], [5, 7], [6, 7]];
    return new THREE.BufferGeometry().setFromPoints(edges.flatMap(([p, q]) => [corners[p], corners[q]]));
  }, [cell]);
  const material = useMemo(() => new THREE.LineBasicMaterial({ color: '#b8862b' }), []);
  useDispose(geometry, material);
  return <lineSegments geometry={geometry} material={material} name="cell" />;
}
