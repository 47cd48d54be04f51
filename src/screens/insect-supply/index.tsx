import { useState } from 'react';
import { StyleSheet, useWindowDimensions, View } from 'react-native';

import { useActiveMembership } from '@/api/session';
import { useSupplyAllocationOptionsQuery, useSupplyPlanQuery, useSupplyPlansQuery } from '@/api/supply-plans';
import { CautionBanner } from '@/components/caution-banner';
import { ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { AppText } from '@/components/ui/text';
import { useUnits } from '@/lib/measures-format';
import type { SupplyPlanDetail } from '@/shared/schemas/supply';
import { space, WIDE_MIN_WIDTH } from '@/theme';

import { AllocationCard } from './allocation';
import { SupplyFlowChart } from './flow-chart';
import { CompositionCard, LandUseCard, RulesCard, SupplyTotals } from './plan-details';
import { SupplyPlanForm } from './plan-form';

export function InsectSupplyScreen() {
  const { can } = useActiveMembership();
  const plans = useSupplyPlansQuery();
  const [chosen, setChosen] = useState<number | null>(null);
  const [editing, setEditing] = useState<'new' | 'edit' | null>(null);
  const canWrite = can('supply:write');
  const options = useSupplyAllocationOptionsQuery(canWrite || can('formulas:solve'));
  const planId = chosen ?? plans.data?.[0]?.id ?? null;
  const detail = useSupplyPlanQuery(planId);
  const insectMeals = options.data?.insectMeals ?? [];

  return (
    <Screen title="Insect supply" lead="From local by-products to larvae meal to this week’s formulas." testID="screen-insect-supply">
      {plans.isError ? <ErrorState error={plans.error} onRetry={() => plans.refetch()} /> : null}
      {plans.isPending ? <AppText muted>Loading your plans…</AppText> : null}
      {plans.data && plans.data.length > 1 ? (
        <ChoiceChips label="Plan" options={plans.data.map((p) => ({ value: String(p.id), label: p.name }))} value={String(planId)} onChange={(v) => setChosen(Number(v))} testID="plan-choice" />
      ) : null}
      {plans.data && plans.data.length === 0 && editing !== 'new' ? (
        <Card title="No supply plan yet">
          <AppText>List the by-products you rear larvae on, with tonnes per week, and Troughline estimates the larvae, frass and meal they give.</AppText>
          {canWrite ? <Button label="Start a plan" onPress={() => setEditing('new')} testID="plan-start" /> : <AppText muted>Ask an owner or nutritionist of your organization to start one.</AppText>}
        </Card>
      ) : null}
      {editing === 'new' ? (
        <SupplyPlanForm
          plan={null}
          insectMeals={insectMeals}
          onSaved={(id) => {
            setChosen(id);
            setEditing(null);
          }}
          onCancel={() => setEditing(null)}
        />
      ) : null}
      {detail.isError ? <ErrorState error={detail.error} onRetry={() => detail.refetch()} /> : null}
      {detail.data && editing !== 'new' ? (
        <PlanView
          plan={detail.data}
          canWrite={canWrite}
          canSolve={can('formulas:solve')}
          editing={editing === 'edit'}
          onEdit={() => setEditing('edit')}
          onNew={() => setEditing('new')}
          onDone={() => setEditing(null)}
          insectMeals={insectMeals}
        />
      ) : null}
    </Screen>
  );
}

function PlanView({ plan, canWrite, canSolve, editing, onEdit, onNew, onDone, insectMeals }: { plan: SupplyPlanDetail; canWrite: boolean; canSolve: boolean; editing: boolean; onEdit: () => void; onNew: () => void; onDone: () => void; insectMeals: { id: number; name: string; hasLab: boolean }[] }) {
  const { width } = useWindowDimensions();
  const wide = width >= WIDE_MIN_WIDTH;
  const p = plan.plan;
  const units = useUnits();
  const main = (
    <View style={styles.column}>
      <Card title={plan.name} testID="supply-plan">
        <CautionBanner compact />
        <SupplyTotals plan={plan} />
        <SupplyFlowChart plan={p} />
        {p.warnings.map((w, k) => (
          <FormMessage key={k} tone="danger" text={w} testID={`plan-warning-${k}`} />
        ))}
        <AppText variant="caption" muted>
          Masses per week. Dry matter fed that ends neither in larvae nor in frass is respired; {Math.round(units.massOf(p.totals.waterLostKg)).toLocaleString('en-GB')} {units.mass} of water a week leaves the rearing as vapour or leachate. Yield factors are defaults from
          rearing trials (each named in the stream editor) unless you set your own.
        </AppText>
        {canWrite && !editing ? (
          <View style={styles.row}>
            <Button label="Edit the streams" tone="quiet" onPress={onEdit} testID="plan-edit" />
            <Button label="New plan" tone="quiet" onPress={onNew} testID="plan-new" />
          </View>
        ) : null}
      </Card>
      {editing ? <SupplyPlanForm key={plan.version} plan={plan} insectMeals={insectMeals} onSaved={onDone} onCancel={onDone} /> : null}
      <CompositionCard plan={plan} />
    </View>
  );
  const side = (
    <View style={styles.column}>
      <RulesCard plan={plan} />
      {canSolve ? <AllocationCard plan={plan} /> : null}
      <LandUseCard key={plan.version} plan={plan} />
    </View>
  );
  return wide ? (
    <View style={styles.wide}>
      <View style={styles.wideCol}>{main}</View>
      <View style={styles.wideCol}>{side}</View>
    </View>
  ) : (
    <View style={styles.column}>
      {main}
      {side}
    </View>
  );
}

const styles = StyleSheet.create({
  column: { gap: space.lg },
  wide: { flexDirection: 'row', gap: space.lg, alignItems: 'flex-start' },
  wideCol: { flex: 1, minWidth: 0 },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
});
