import type { LabValue } from '@/shared/lab-import/types';

/**
 * A value with sensible decimals for its size; energy without decimals. Lab values are concentrations
 * (%, g/kg, kcal/kg): ratios of one mass to another, not masses, so they read the same whether the
 * organization works in metric or US units and are never converted. This screen shows no amounts and
 * no prices.
 */
export function formatValue(value: number, unit: string): string {
  if (unit === 'kcal/kg') return Math.round(value).toLocaleString('en-GB');
  const abs = Math.abs(value);
  const digits = abs >= 100 ? 1 : abs >= 1 ? 2 : 3;
  return value.toLocaleString('en-GB', { maximumFractionDigits: digits, minimumFractionDigits: 0 });
}

export const ORIGIN_LABELS: Record<LabValue['origin'], string> = {
  measured: 'Lab',
  calculated: 'Calculated',
  estimated: 'Estimated',
  override: 'Entered',
};
