import type { ComponentType } from 'react';

import { AccountIcon, FormulasIcon, InsectSupplyIcon, LibraryIcon, RequirementsIcon } from './section-icons';

export type Section = {
  /** Route name inside app/(tabs). */
  name: string;
  href: '/' | '/library' | '/requirements' | '/insect-supply' | '/account';
  label: string;
  /** One line saying what the section is for; shown on the wide rail. */
  hint: string;
  Icon: ComponentType<{ color: string; size?: number }>;
};

/** The five sections of the app, in navigation order. */
export const SECTIONS: readonly Section[] = [
  { name: 'index', href: '/', label: 'Formulas', hint: 'Least-cost mixes and their versions', Icon: FormulasIcon },
  { name: 'library', href: '/library', label: 'Library', hint: 'Ingredients, nutrients and prices', Icon: LibraryIcon },
  { name: 'requirements', href: '/requirements', label: 'Requirements', hint: 'Specifications per species and phase', Icon: RequirementsIcon },
  { name: 'insect-supply', href: '/insect-supply', label: 'Insect supply', hint: 'By-products to larvae meal', Icon: InsectSupplyIcon },
  { name: 'account', href: '/account', label: 'Account', hint: 'Organization, members and settings', Icon: AccountIcon },
];
