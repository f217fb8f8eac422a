export * from './form-factors';
export * from './wavelengths';
export * from './units';
export * from './scatterers';
export * from './hkl-sum';
export * from './cartesian-sum';
export * from './structure-factor';
export * from './sf-grid';
export * from './sf-friedel';
export * from './merge';
export * from './lorentz-polarization';
export * from './profile';
export * from './powder';
export * from './intensity-at';
export * from './pair-histogram';
export * from './debye';
export * from './debye-powder';
export * from './window-transform';
export * from './indexing';
export * from './hyperspace';
export * from './zone-axis';
export * from './compare';
export * from './peak-table';
// The quasicrystal's own pattern, indexing and aR (quasicrystal/). Its peak finder (fitted positions with σ,
// widths and areas) shares a name with the comparison's simple one in compare.ts: that one keeps the plain name,
// this one is re-exported as findFittedPeaks.
export * from './quasicrystal';
export { findPeaks } from './compare';
export { findPeaks as findFittedPeaks } from './quasicrystal/peak-find';
