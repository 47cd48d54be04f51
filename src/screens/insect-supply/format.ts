/** Masses per week as a person reads them: kg below a tonne, t above. */
export function mass(kg: number): { value: string; unit: string } {
  if (Math.abs(kg) >= 1000) return { value: (kg / 1000).toLocaleString('en-GB', { maximumFractionDigits: 2, minimumFractionDigits: 2 }), unit: 't/week' };
  return { value: kg.toLocaleString('en-GB', { maximumFractionDigits: 1, minimumFractionDigits: 1 }), unit: 'kg/week' };
}

export const massText = (kg: number) => {
  const m = mass(kg);
  return `${m.value} ${m.unit}`;
};

export const num = (x: number, digits = 1) => x.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits });

/** Text typed in a field → number, accepting a decimal comma; empty → null. */
export function parseNumber(text: string): number | null {
  const t = text.trim().replace(',', '.');
  if (!t) return null;
  return Number(t);
}
