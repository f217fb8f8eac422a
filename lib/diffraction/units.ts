/** The units every diffraction output states (JSON `units` field, CSV header comment). */
export const DIFFRACTION_UNITS = {
  q: 'Å⁻¹, |Q| = 4π sinθ/λ = 2π/d, phase Q·r',
  d: 'Å',
  twoTheta: 'degrees',
  wavelength: 'Å',
  intensity: 'relative (largest peak = 100) unless stated',
} as const;

export const UNITS_COMMENT = '# units: 2θ in degrees; d in Å; |Q| in Å⁻¹ with |Q| = 4π sinθ/λ = 2π/d (phase Q·r)';
