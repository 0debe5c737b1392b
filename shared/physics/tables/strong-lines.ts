/**
 * Strong lines of stellar spectra with their rest wavelengths in AIR, in m
 * (NIST Atomic Spectra Database values as quoted in standard line lists; the
 * team handbook REFERENCES.md, "Strong lines"). Offered as a pick-list for
 * the rest wavelength of a line; compare them with air wavelengths only.
 */
export interface StrongLine {
  readonly id: string;
  readonly label: string;
  readonly restWavelengthAirM: number;
}

export const STRONG_LINES_SOURCE = 'NIST Atomic Spectra Database, air wavelengths as quoted in standard line lists';

export const STRONG_LINES: readonly StrongLine[] = Object.freeze([
  { id: 'h_alpha', label: 'Hα', restWavelengthAirM: 656.279e-9 },
  { id: 'h_beta', label: 'Hβ', restWavelengthAirM: 486.135e-9 },
  { id: 'h_gamma', label: 'Hγ', restWavelengthAirM: 434.047e-9 },
  { id: 'ca_ii_k', label: 'Ca II K', restWavelengthAirM: 393.3663e-9 },
  { id: 'ca_ii_h', label: 'Ca II H', restWavelengthAirM: 396.8469e-9 },
  { id: 'na_d2', label: 'Na I D2', restWavelengthAirM: 588.995e-9 },
  { id: 'na_d1', label: 'Na I D1', restWavelengthAirM: 589.5924e-9 },
  { id: 'mg_b1', label: 'Mg I b1', restWavelengthAirM: 518.3604e-9 },
  { id: 'mg_b2', label: 'Mg I b2', restWavelengthAirM: 517.2684e-9 },
].map((line) => Object.freeze(line)));
