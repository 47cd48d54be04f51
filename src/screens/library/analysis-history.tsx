import { StyleSheet, View } from 'react-native';
import { Link } from 'expo-router';

import { useIngredientAnalysesQuery } from '@/api/lab-imports';
import { ErrorState } from '@/components/error-state';
import { Card } from '@/components/ui/card';
import { AppText, Figure } from '@/components/ui/text';
import type { CatalogueNutrient, LabValue } from '@/shared/lab-import/types';
import type { LabAnalysisRecord } from '@/shared/schemas/lab-imports';
import type { CompositionBasis } from '@/shared/units';
import { colors, space, TOUCH_MIN } from '@/theme';

import { formatValue } from './format';

/**
 * Every lab analysis of one of our ingredients, newest first, typed in or imported: its date, lab and
 * sample, who recorded it and how, its values on the chosen basis, and which of them went into the
 * library, so a reader can trace each number back to a report.
 */
export function AnalysisHistory({ ingredientId, basis, canCompare }: { ingredientId: number; basis: CompositionBasis; canCompare: boolean }) {
  const query = useIngredientAnalysesQuery(ingredientId);
  return (
    <Card title="Lab analyses" testID="analysis-history">
      {query.isError ? <ErrorState error={query.error} onRetry={() => query.refetch()} /> : null}
      {!query.data && !query.isError ? <AppText muted>Loading the analyses…</AppText> : null}
      {query.data && query.data.analyses.length === 0 ? <AppText muted testID="analysis-history-empty">No lab analysis recorded yet.</AppText> : null}
      {query.data
        ? [...query.data.analyses].reverse().map((a) => <Analysis key={a.id} analysis={a} catalogue={query.data.catalogue} basis={basis} />)
        : null}
      {canCompare && query.data && query.data.analyses.length > 1 ? (
        <Link href={`/lab-import/history?ingredient=${ingredientId}`} testID="analysis-history-compare" style={styles.link}>
          <AppText style={styles.linkText}>Compare the analyses side by side</AppText>
        </Link>
      ) : null}
    </Card>
  );
}

function Analysis({ analysis: a, catalogue, basis }: { analysis: LabAnalysisRecord; catalogue: CatalogueNutrient[]; basis: CompositionBasis }) {
  const how = a.entry === 'typed' ? 'Typed in by hand' : `Imported from ${a.fileName ?? 'a lab file'}`;
  const who = a.recordedBy ? ` by ${a.recordedBy}` : '';
  const shown = a.values.filter((v) => v.nutrientId !== 'dm');
  const applied = new Set(a.applied);
  return (
    <View style={styles.analysis} testID={`analysis-${a.id}`}>
      <AppText variant="label">
        {a.analysedOn} · {a.labName}
      </AppText>
      <AppText variant="small" testID={`analysis-${a.id}-entry`}>
        {how}
        {who} on {a.recordedAt.slice(0, 10)}
        {a.sampleId ? ` · sample ${a.sampleId}` : ''}
        {a.sampleName ? ` (${a.sampleName})` : ''}
      </AppText>
      <View style={styles.line}>
        <AppText variant="small" style={styles.name}>Dry matter</AppText>
        <View style={styles.valueCell}>
          <Figure value={formatValue(a.dryMatterPct, '%')} unit="%" />
          {!applied.has('dm') ? <AppText variant="caption" style={styles.notApplied}>not applied: a later-dated analysis held it</AppText> : null}
        </View>
      </View>
      {shown.map((v) => (
        <ValueLine key={v.nutrientId} value={v} analysisId={a.id} name={catalogue.find((n) => n.id === v.nutrientId)?.name ?? v.nutrientId} basis={basis} applied={applied.has(v.nutrientId)} />
      ))}
    </View>
  );
}

function ValueLine({ value: v, analysisId, name, basis, applied }: { value: LabValue; analysisId: number; name: string; basis: CompositionBasis; applied: boolean }) {
  const figure = basis === 'as_fed' ? v.asFed : v.dryMatter;
  const how = v.origin === 'estimated' ? `estimated${v.method ? `: ${v.method.name}` : ''}` : v.origin === 'override' ? 'entered over the estimate' : v.origin === 'calculated' ? `calculated${v.method ? `: ${v.method.name}` : ''}` : null;
  return (
    <View style={styles.line} testID={`analysis-${analysisId}-${v.nutrientId}`}>
      <AppText variant="small" style={styles.name}>{name}</AppText>
      <View style={styles.valueCell}>
        <Figure value={formatValue(figure, v.unit)} unit={basis === 'as_fed' ? `${v.unit} as fed` : `${v.unit} of DM`} />
        {how ? <AppText variant="caption" style={styles.estimate}>{how}</AppText> : null}
        {!applied ? <AppText variant="caption" style={styles.notApplied}>not applied: a later-dated analysis held it</AppText> : null}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  analysis: { gap: space.xs, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.rule },
  line: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'flex-start', gap: space.md },
  name: { flex: 1 },
  valueCell: { alignItems: 'flex-end', flexShrink: 1 },
  estimate: { color: colors.caution, textAlign: 'right' },
  notApplied: { color: colors.inkMuted, textAlign: 'right' },
  link: { minHeight: TOUCH_MIN, justifyContent: 'center' },
  linkText: { color: colors.brand, textDecorationLine: 'underline' },
});
