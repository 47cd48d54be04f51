/**
 * Mass units and currency for what people read: an organization works in metric (kg, t) or US units
 * (lb, short ton). Amounts are stored and computed in kg; only what is shown, typed, printed and
 * exported is converted, with the exact factors of the definitions:
 *   1 lb = 0.45359237 kg (exact by definition), 1 short ton = 2,000 lb = 907.18474 kg, 1 t = 1,000 kg.
 * Pure: no framework imports.
 */

/** `metric`: kg and tonnes; `us`: pounds and short tons. */
export const UNIT_SYSTEMS = ['metric', 'us'] as const;
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];

/** Kilograms in one avoirdupois pound (exact, by definition). */
export const KG_PER_LB = 0.45359237;
/** Pounds in one short ton (exact). */
export const LB_PER_SHORT_TON = 2000;
/** Kilograms in one short ton: 2,000 × 0.45359237 = 907.18474 (exact). */
export const KG_PER_SHORT_TON = 907.18474;
/** Kilograms in one tonne (exact). */
export const KG_PER_TONNE = 1000;

/** The unit a batch and each ingredient's amount are weighed in. */
export type MassUnit = 'kg' | 'lb';
/** The unit of a large quantity (a price per tonne, a week's tonnage). */
export type BulkUnit = 't' | 'short ton';

export const massUnit = (system: UnitSystem): MassUnit => (system === 'us' ? 'lb' : 'kg');
export const bulkUnit = (system: UnitSystem): BulkUnit => (system === 'us' ? 'short ton' : 't');

/** kg → lb. */
export const kgToLb = (kg: number): number => kg / KG_PER_LB;
/** lb → kg. */
export const lbToKg = (lb: number): number => lb * KG_PER_LB;
/** t → short tons (1 t = 1.102311310924388 short tons). */
export const tonneToShortTon = (t: number): number => (t * KG_PER_TONNE) / KG_PER_SHORT_TON;
/** short tons → t. */
export const shortTonToTonne = (st: number): number => (st * KG_PER_SHORT_TON) / KG_PER_TONNE;

/** An amount in kg as the organization reads it (kg or lb). */
export function massFromKg(kg: number, system: UnitSystem): number {
  return system === 'us' ? kgToLb(kg) : kg;
}

/** An amount the organization typed (kg or lb) back to kg. */
export function massToKg(value: number, system: UnitSystem): number {
  return system === 'us' ? lbToKg(value) : value;
}

/** A price per kg as the organization reads it: per kg or per lb. */
export function pricePerMassUnit(pricePerKg: number, system: UnitSystem): number {
  return system === 'us' ? pricePerKg * KG_PER_LB : pricePerKg;
}

/** A typed price per kg or per lb back to per kg. */
export function pricePerKgFrom(price: number, system: UnitSystem): number {
  return system === 'us' ? price / KG_PER_LB : price;
}

/** A cost per tonne as the organization reads it: per t or per short ton. */
export function costPerBulkUnit(costPerTonne: number, system: UnitSystem): number {
  return system === 'us' ? (costPerTonne * KG_PER_SHORT_TON) / KG_PER_TONNE : costPerTonne;
}

/** ISO 4217 codes offered in settings (any three capital letters are accepted). */
export const COMMON_CURRENCIES = ['EUR', 'USD', 'GBP', 'KES', 'UGX', 'TZS', 'NGN', 'GHS', 'ZAR', 'INR', 'BRL', 'CAD', 'AUD'] as const;

/** An organization's reading preferences. Defaults: metric, EUR. */
export type Measures = { unitSystem: UnitSystem; currency: string };
export const DEFAULT_MEASURES: Measures = { unitSystem: 'metric', currency: 'EUR' };

/** True for a three-letter ISO 4217-shaped code such as EUR or KES. */
export const isCurrencyCode = (code: string): boolean => /^[A-Z]{3}$/.test(code);

/** Digits to show for a money amount: two, or four for small prices per kg or lb. */
export function moneyDigits(value: number): number {
  return Math.abs(value) > 0 && Math.abs(value) < 1 ? 4 : 2;
}

/** A money amount with its currency code, e.g. "0.3120 EUR" or "312.00 EUR". */
export function formatMoney(value: number, currency: string, digits = moneyDigits(value)): string {
  return `${value.toFixed(digits)} ${currency}`;
}

/** Decimals needed to show multiples of a scale step exactly (0.5 → 1, 0.01 → 2, 1 → 0). */
export function stepDecimals(step: number): number {
  for (let d = 0; d <= 6; d++) if (Math.abs(Math.round(step * 10 ** d) - step * 10 ** d) < 1e-9) return d;
  return 6;
}

/** A nutrient level or amount with as many decimals as its size needs (3050; 18.2; 1.07; 0.085). */
export function formatLevel(v: number): string {
  const a = Math.abs(v);
  const digits = a >= 100 ? 0 : a >= 10 ? 1 : a >= 1 ? 2 : 3;
  return v.toFixed(digits);
}
