import type { Units } from '@/lib/measures-format';
import type { FormulaPriceSweep } from '@/shared/schemas/formulas';

/** What the sentence needs of the organization's units. */
export type SweepUnits = Pick<Units, 'priceOf' | 'massText' | 'currency' | 'mass'>;

/** A share of the batch under 1 g per tonne reads as none, as in the engine. */
const NONE_KG_PER_KG = 1e-6;

/**
 * The one sentence that says where a swept ingredient stands: the price at which it enters, that it is
 * already in at today's price, that it stays out or in over the whole range, or that a fixed amount, a
 * minimum or the specification keeps it in at any price. Prices in the organization's currency per kg or lb.
 */
export function sweepSentence(data: FormulaPriceSweep, units: SweepUnits): string {
  const { sweep, ingredientName: name } = data;
  const per = `${units.currency} per ${units.mass}`;
  const p = (perKg: number) => `${units.priceOf(perKg).toFixed(3)} ${per}`;
  const today = `today’s price is ${p(data.currentPricePerKg)}`;
  const range = `from ${units.priceOf(sweep.fromPrice).toFixed(3)} to ${p(sweep.toPrice)}`;
  const usedToday = sweep.current.kg !== null && sweep.current.kg > NONE_KG_PER_KG * data.batchKg;
  const e = sweep.entry;
  switch (e.kind) {
    case 'enters_in_range':
      return usedToday
        ? `${name} is already in the mix at today’s price of ${p(data.currentPricePerKg)}. It stays in up to ${p(e.price)}; above that it is left out.`
        : `${name} enters the mix at ${p(e.price)} or less; ${today}, so it is left out today.`;
    case 'never_in_range': {
      const why =
        e.entersAtPrice === null
          ? 'Its limits or the specification keep it out at any price.'
          : e.entersAtPrice < 0
            ? 'It would not enter even free.'
            : `It would enter at ${p(e.entersAtPrice)} or less.`;
      return `${name} stays out of the mix at every price swept, ${range}. ${why} Today’s price is ${p(data.currentPricePerKg)}.`;
    }
    case 'in_throughout_range':
      return `${name} is in the mix at every price swept, ${range}; it is left out only above ${p(e.leavesAbovePrice)}. Today’s price is ${p(data.currentPricePerKg)}.`;
    case 'always_in': {
      const least = `${units.massText(e.leastKg)} (${e.leastPercent.toFixed(2)} % of the batch)`;
      const why =
        e.reason === 'fixed'
          ? `its fixed amount of ${least} keeps it in`
          : e.reason === 'minimum'
            ? `its minimum inclusion of ${least} keeps it in`
            : `the specification cannot be met with less than ${least}`;
      const more =
        e.risesAbovePrice === null
          ? 'Its price cannot change how much is used.'
          : `More than that is used at ${p(e.risesAbovePrice)} or less; ${today}.`;
      return `${name} is in the mix at any price: ${why}. ${more}`;
    }
    case 'no_mix':
      return `No mix meets the specification at any price of ${name}, so there is no price at which it enters. Change the bounds or the ingredients first.`;
    case 'failed':
      return `The price at which ${name} enters could not be settled (${e.message}). The prices below were solved, but no entering price is given.`;
  }
}
