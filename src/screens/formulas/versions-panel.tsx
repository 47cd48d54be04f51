import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { useFormulaCompareQuery, useVersionApproveMutation } from '@/api/formulas';
import { useActiveMembership } from '@/api/session';
import { CautionBanner } from '@/components/caution-banner';
import { describeError } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { AppText, Figure } from '@/components/ui/text';
import type { Units } from '@/lib/measures-format';
import type { FormulaDetail, VersionSummary } from '@/shared/schemas/formulas';
import { colors, fonts, space } from '@/theme';

import { money, pct, signed, when } from './format';
import { StatusBadge } from './status-badge';

/** Kept versions: view one, approve one (nutritionists; not while the formula is archived), compare two side by side. */
export function VersionsPanel({ formula, viewing, onView, units, readOnly = false }: { units: Units; formula: FormulaDetail; viewing: number | null; onView: (id: number) => void; readOnly?: boolean }) {
  const { can } = useActiveMembership();
  const mayApprove = can('formulas:approve') && !readOnly;
  const approve = useVersionApproveMutation(formula.id);
  const current = formula.versions.find((v) => v.approval === 'current');
  return (
    <Card title="Versions" testID="versions-panel">
      <AppText variant="small" muted>Each kept solve is a version that never changes: its inputs, the library values and prices as used, and the result. Only the approved version reaches the mill.</AppText>
      {formula.versions.length === 0 ? <AppText muted>No versions yet. Solve, then “Keep as version”.</AppText> : null}
      {formula.versions.map((v) => (
        <View key={v.id} style={[styles.version, viewing === v.id && styles.viewing]} testID={`version-${v.number}`}>
          <View style={styles.versionHead}>
            <AppText variant="label">Version {v.number}</AppText>
            <StatusBadge status={v.status} label={v.status === 'optimal' ? 'Mix' : 'Result'} />
            {v.approval === 'current' ? <StatusBadge status="approved" label={`Approved by ${v.approvedBy}, ${when(v.approvedAt)}: the mill uses this one`} /> : null}
            {v.approval === 'superseded' ? <StatusBadge status="superseded" label={`Approved by ${v.approvedBy}, superseded by a newer approval`} /> : null}
          </View>
          <AppText variant="small" muted>Kept by {v.createdBy}, {when(v.createdAt)}{v.note ? ` · ${v.note}` : ''}</AppText>
          {v.costPerTonne !== null ? <Figure value={money(units.costOf(v.costPerTonne))} unit={`${units.currency} per ${units.tonneWord}`} /> : null}
          <View style={styles.actions}>
            <Button label="View" tone="quiet" onPress={() => onView(v.id)} testID={`view-version-${v.number}`} />
            {mayApprove && v.status === 'optimal' && v.approval === 'not_approved' ? (
              <Button label="Approve for the mill" onPress={() => approve.mutate(v.id)} disabled={approve.isPending} testID={`approve-version-${v.number}`} />
            ) : null}
          </View>
          {mayApprove && v.status === 'optimal' && v.approval === 'not_approved' && current ? (
            <AppText variant="caption" muted>Approving it supersedes version {current.number}: the mill will then see this version instead.</AppText>
          ) : null}
        </View>
      ))}
      <FormMessage tone="danger" text={approve.isError ? describeError(approve.error) : null} testID="approve-error" />
      {formula.versions.length >= 2 ? <Compare formulaId={formula.id} versions={formula.versions} units={units} /> : null}
    </Card>
  );
}

function Compare({ formulaId, versions, units }: { formulaId: number; versions: VersionSummary[]; units: Units }) {
  const cost = (perTonne: number | null) => (perTonne === null ? '—' : units.money(units.costOf(perTonne), 2));
  const [a, setA] = useState(String(versions[1].id));
  const [b, setB] = useState(String(versions[0].id));
  const diff = useFormulaCompareQuery(formulaId, Number(a), Number(b));
  const options = versions.map((v) => ({ value: String(v.id), label: `v${v.number}` }));
  const d = diff.data;
  return (
    <View style={styles.compare} testID="compare">
      <AppText variant="lead">Compare two versions</AppText>
      <ChoiceChips label="First (A)" value={a} onChange={setA} options={options} testID="compare-a" />
      <ChoiceChips label="Second (B)" value={b} onChange={setB} options={options} testID="compare-b" />
      {a === b ? <AppText muted>Choose two different versions.</AppText> : null}
      {diff.isError ? <FormMessage tone="danger" text={describeError(diff.error)} /> : null}
      {d ? (
        <View style={styles.compareBody} testID="compare-result">
          <CautionBanner compact />
          <AppText>
            Cost per {units.tonneWord}: A {cost(d.cost.aPerTonne)}, B {cost(d.cost.bPerTonne)}
            {d.cost.diffPerTonne !== null ? `, B − A ${signed(units.costOf(d.cost.diffPerTonne))} ${units.currency} per ${units.tonneWord}` : ' (one of them has no mix)'}
          </AppText>
          <View style={styles.row}>
            <AppText variant="label" style={styles.name}>Ingredient</AppText>
            <AppText variant="label" style={styles.num}>A %</AppText>
            <AppText variant="label" style={styles.num}>B %</AppText>
            <AppText variant="label" style={styles.num}>B − A</AppText>
          </View>
          {d.mix.map((m) => (
            <View key={m.id} style={styles.row}>
              <AppText variant="small" style={styles.name}>{m.name}</AppText>
              <AppText variant="small" style={[styles.num, styles.mono]}>{pct(m.aPercent)}</AppText>
              <AppText variant="small" style={[styles.num, styles.mono]}>{pct(m.bPercent)}</AppText>
              <AppText variant="small" style={[styles.num, styles.mono, Math.abs(m.diffPercent) > 0.005 && styles.changed]}>{signed(m.diffPercent)}</AppText>
            </View>
          ))}
          <View style={styles.row}>
            {/* Nutrient levels are concentrations (per kg of feed): they read the same in US units. */}
            <AppText variant="label" style={styles.name}>Nutrient (as fed, per kg of feed)</AppText>
            <AppText variant="label" style={styles.num}>A</AppText>
            <AppText variant="label" style={styles.num}>B</AppText>
            <AppText variant="label" style={styles.num}>B − A</AppText>
          </View>
          {d.nutrients.map((n) => (
            <View key={n.id} style={styles.row}>
              <AppText variant="small" style={styles.name}>{n.name}, {n.unit}</AppText>
              <AppText variant="small" style={[styles.num, styles.mono]}>{n.a?.toFixed(n.unit === 'kcal/kg' ? 0 : 3) ?? '—'}</AppText>
              <AppText variant="small" style={[styles.num, styles.mono]}>{n.b?.toFixed(n.unit === 'kcal/kg' ? 0 : 3) ?? '—'}</AppText>
              <AppText variant="small" style={[styles.num, styles.mono]}>{n.diff === null ? '—' : signed(n.diff, n.unit === 'kcal/kg' ? 0 : 3)}</AppText>
            </View>
          ))}
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  version: { gap: space.xs, padding: space.md, borderRadius: 8, borderWidth: 1, borderColor: colors.rule },
  viewing: { borderColor: colors.brand, borderWidth: 2 },
  versionHead: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  compare: { gap: space.md, paddingTop: space.md, borderTopWidth: 1, borderTopColor: colors.rule },
  compareBody: { gap: space.xs },
  row: { flexDirection: 'row', gap: space.sm, paddingVertical: 2, borderBottomWidth: 1, borderBottomColor: colors.paperSunken },
  name: { flex: 3 },
  num: { flex: 1, textAlign: 'right' },
  mono: { fontFamily: fonts.figures },
  changed: { color: colors.accent },
});
