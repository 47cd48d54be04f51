import { ChoiceChips } from '@/components/ui/choice-chips';
import type { CompositionBasis } from '@/shared/units';

const OPTIONS = [
  { value: 'as_fed' as const, label: 'As fed' },
  { value: 'dry_matter' as const, label: 'Dry matter' },
];

/** Switches a composition table between as-fed and dry-matter values. */
export function BasisToggle({ value, onChange }: { value: CompositionBasis; onChange: (basis: CompositionBasis) => void }) {
  return <ChoiceChips label="Values per kg" options={OPTIONS} value={value} onChange={onChange} testID="basis" />;
}
