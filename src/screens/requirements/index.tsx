import { Screen } from '@/components/screen';
import { SectionPlan } from '@/components/section-plan';

export function RequirementsScreen() {
  return (
    <Screen title="Requirements" lead="Nutrient specifications per species and production phase." testID="screen-requirements">
      <SectionPlan
        items={[
          'set minimums and maximums for energy, digestible amino acids, minerals, fibre and fat',
          'set ratios such as calcium to available phosphorus',
          'cap groups of ingredients, such as all insect meals together',
        ]}
      />
    </Screen>
  );
}
