import { Screen } from '@/components/screen';
import { SectionPlan } from '@/components/section-plan';

export function LibraryScreen() {
  return (
    <Screen title="Library" lead="Your ingredients, their nutrient values and prices." testID="screen-library">
      <SectionPlan
        items={[
          'start from published table values and refine them with your own lab analyses',
          'keep insect meals with the substrate they were reared on',
          'keep a dated price history for every ingredient',
        ]}
      />
    </Screen>
  );
}
