/**
 * Troughline palette. Named for what each colour does on screen, so a screen never picks a hex value.
 * Contrast: `ink` on `paper` and `paperRaised` is above 12:1; `onBrand` on `brand` above 8:1 (WCAG AA for body text).
 */
export const colors = {
  /** Page background: a warm, unbleached tone that is easy on the eyes in a bright mill office. */
  paper: '#F6F3EC',
  paperRaised: '#FFFFFF',
  paperSunken: '#ECE7DC',
  ink: '#1D2321',
  inkMuted: '#55605B',
  inkFaint: '#7D8782',
  rule: '#D6D0C2',
  /** Brand: a deep spruce green. */
  brand: '#1F4B43',
  brandSoft: '#DCE8E3',
  onBrand: '#F6F3EC',
  /** Accent for insect-meal related marks (charts, badges). */
  accent: '#B8741E',
  accentSoft: '#F4E6D2',
  /** States. */
  ok: '#2F6B3A',
  okSoft: '#E1EFDF',
  caution: '#8A5A00',
  cautionSoft: '#FFF3D6',
  danger: '#A3301C',
  dangerSoft: '#F9E1DB',
} as const;

export type ColorName = keyof typeof colors;
