import type { Units } from '@/lib/measures-format';

/**
 * Masses per week as a person reads them: kg below a tonne and t above (metric), or lb below a short
 * ton and short tons above (US). The plan is computed in kg; only the display converts.
 */
export function mass(units: Units, kg: number): { value: string; unit: string } {
  const small = units.massOf(kg);
  const bulk = units.bulkOf(kg / 1000);
  if (Math.abs(bulk) >= 1) return { value: bulk.toLocaleString('en-GB', { maximumFractionDigits: 2, minimumFractionDigits: 2 }), unit: `${units.bulk}/week` };
  return { value: small.toLocaleString('en-GB', { maximumFractionDigits: 1, minimumFractionDigits: 1 }), unit: `${units.mass}/week` };
}

export const massText = (units: Units, kg: number) => {
  const m = mass(units, kg);
  return `${m.value} ${m.unit}`;
};

export const num = (x: number, digits = 1) => x.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: digits });

/** Text typed in a field → number, accepting a decimal comma; empty → null. */
export function parseNumber(text: string): number | null {
  const t = text.trim().replace(',', '.');
  if (!t) return null;
  return Number(t);
}
