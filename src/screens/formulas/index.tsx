import { Screen } from '@/components/screen';
import { SectionPlan } from '@/components/section-plan';

export function FormulasScreen() {
  return (
    <Screen title="Formulas" lead="The cheapest mix that meets a specification at today’s prices." testID="screen-formulas">
      <SectionPlan
        items={[
          'pick a species and phase, then the ingredients you have and their prices',
          'solve the least-cost mix and see which requirements drive its cost',
          'see what insect meal is worth in each diet',
          'keep versions, approve one and hand a batch sheet to the mixer',
        ]}
      />
    </Screen>
  );
}
