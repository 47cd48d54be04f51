import type { Units } from '@/lib/measures-format';
import type { NutrientUnit } from '@/shared/library-terms';

/** Digits shown per unit: energy in whole kcal, percentages to two places (three below 0.1 %). */
export function formatValue(value: number | null | undefined, unit: NutrientUnit): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (unit === 'kcal/kg' || unit === 'IU/kg' || unit === 'mg/kg') return Math.round(value).toLocaleString('en');
  if (unit === 'MJ/kg') return value.toFixed(2);
  if (unit === '%' && Math.abs(value) < 0.1 && value !== 0) return value.toFixed(3);
  return value.toFixed(2);
}

/** A price stored per kg, shown per kg (3 decimals) or per lb (4: a per-lb price is under half the per-kg one). */
export function formatPrice(value: number | null, units: Units): string {
  return value === null ? 'no price' : units.priceOf(value).toFixed(units.system === 'us' ? 4 : 3);
}
