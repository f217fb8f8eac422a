/**
 * Complex bound coherent neutron scattering lengths b = b′ − i b″ of the strongly absorbing elements, and
 * their absorption cross sections σ_a, at the reference neutron velocity 2200 m/s (λ = 1.798 Å).
 * Source: V. F. Sears, Neutron News 3 (1992) 26–37, Table 1 (natural isotopic mixtures). The real parts
 * are the ones gemmi carries (data/scattering-tables.ts); the imaginary parts and σ_a are FROM MEMORY of
 * that table and are checked in tests/unit/diffraction against python3-periodictable 1.6 (Rauch &
 * Waschkowski 2003 values, with Lynn & Seeger 1990 energy dependence for Sm, Eu, Gd evaluated at 1.798 Å).
 * For Sm, Eu, Gd the lengths depend strongly on wavelength (resonances); other wavelengths are not covered.
 */

/** Atomic number → { imaginary part b″ in fm (b = b′ − i b″), absorption cross section σ_a in barn at 1.798 Å }. */
export const NEUTRON_ABSORBING: Readonly<Record<number, { bImag: number; sigmaAbs: number }>> = {
  5: { bImag: 0.213, sigmaAbs: 767 }, // B
  48: { bImag: 0.7, sigmaAbs: 2520 }, // Cd
  62: { bImag: 1.65, sigmaAbs: 5922 }, // Sm
  63: { bImag: 1.26, sigmaAbs: 4530 }, // Eu
  64: { bImag: 13.82, sigmaAbs: 49700 }, // Gd
  66: { bImag: 0.276, sigmaAbs: 994 }, // Dy
};
