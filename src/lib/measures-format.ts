import { useMemo } from 'react';

import { useMeasures, useOrganizationSettingsQuery } from '@/api/organization-settings';
import {
  bulkUnit,
  costPerBulkUnit,
  formatLevel,
  formatMoney,
  massFromKg,
  massToKg,
  massUnit,
  pricePerKgFrom,
  pricePerMassUnit,
  tonneToShortTon,
  shortTonToTonne,
  type Measures,
} from '@/shared/measures';

const TONNE_WORDS = { metric: 'tonne', us: 'short ton' } as const;

/**
 * The organization's units and currency as the screens show and read them. The API stays in kg,
 * tonnes and prices per kg; these helpers convert only what is displayed and what is typed, with the
 * exact factors of src/shared/measures.ts. Nutrient levels (%, g/kg, kcal/kg) are concentrations and
 * never pass through here.
 */
export function unitsFor(measures: Measures) {
  const { unitSystem: system, currency } = measures;
  const mass = massUnit(system);
  const bulk = bulkUnit(system);
  return {
    system,
    currency,
    /** 'kg' or 'lb'. */
    mass,
    /** 't' or 'short ton' (short form for tight columns). */
    bulk,
    /** 'tonne' or 'short ton' (words for sentences). */
    tonneWord: TONNE_WORDS[system],
    /** An amount in kg in the organization's unit (number). */
    massOf: (kg: number) => massFromKg(kg, system),
    /** An amount in kg as text with its unit: "1000 kg", "2204.6 lb". */
    massText: (kg: number) => `${formatLevel(massFromKg(kg, system))} ${mass}`,
    /** A typed amount (kg or lb) back to kg. */
    massToKg: (value: number) => massToKg(value, system),
    /** Tonnes in the organization's bulk unit (number). */
    bulkOf: (tonnes: number) => (system === 'us' ? tonneToShortTon(tonnes) : tonnes),
    /** A typed bulk amount (t or short tons) back to tonnes. */
    bulkToTonnes: (value: number) => (system === 'us' ? shortTonToTonne(value) : value),
    /** A price per kg as a price per kg or per lb (number). */
    priceOf: (pricePerKg: number) => pricePerMassUnit(pricePerKg, system),
    /** A typed price per kg or per lb back to per kg. */
    priceToKg: (typed: number) => pricePerKgFrom(typed, system),
    /** A cost per tonne as per tonne or per short ton (number). */
    costOf: (perTonne: number) => costPerBulkUnit(perTonne, system),
    /** Money with its currency code: "0.3120 EUR". */
    money: (value: number, digits?: number) => formatMoney(value, currency, digits),
  };
}

export type Units = ReturnType<typeof unitsFor>;

/** The active organization's units and currency (metric and EUR until the settings arrive). */
export function useUnits(): Units {
  const measures = useMeasures();
  return useMemo(() => unitsFor(measures), [measures.unitSystem, measures.currency]); // eslint-disable-line react-hooks/exhaustive-deps
}

/**
 * False until the organization's settings have arrived (or failed: then metric). A form whose fields
 * start from converted values must wait for it, or it would start in kg and be read as lb.
 */
export function useUnitsReady(): boolean {
  return !useOrganizationSettingsQuery().isPending;
}

/**
 * A typed decimal in the organization's unit back to the API's metric value, rounded to drop the
 * float noise of the division (12 significant digits keep 1 lb → 0.45359237 kg exact).
 */
export function toMetric(typed: number, convert: (v: number) => number): number {
  return Number(convert(typed).toPrecision(12));
}

/** An API value shown in an input box in the organization's unit (6 significant digits once converted). */
export function toInput(value: number, convert: (v: number) => number): string {
  const shown = convert(value);
  return shown === value ? String(value) : String(Number(shown.toPrecision(6)));
}
