import { Screen } from '@/components/screen';
import { SectionPlan } from '@/components/section-plan';

export function InsectSupplyScreen() {
  return (
    <Screen title="Insect supply" lead="From local by-products to larvae meal to this week’s formulas." testID="screen-insect-supply">
      <SectionPlan
        items={[
          'estimate the larvae, meal and frass your by-product streams will give each week',
          'estimate the meal’s composition from what the larvae were reared on',
          'share a limited amount of meal across the week’s formulas where it saves most',
        ]}
      />
    </Screen>
  );
}
