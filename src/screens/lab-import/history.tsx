import { useState } from 'react';
import { Link, useLocalSearchParams } from 'expo-router';
import { ScrollView, StyleSheet, View } from 'react-native';

import { useIngredientAnalysesQuery, useLabTargetIngredientsQuery } from '@/api/lab-imports';
import { ErrorState } from '@/components/error-state';
import { Screen } from '@/components/screen';
import { CautionBanner } from '@/components/caution-banner';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { AppText } from '@/components/ui/text';
import type { IngredientAnalyses } from '@/shared/schemas/lab-imports';
import { colors, space } from '@/theme';

import { formatValue } from './format';
import { Select } from './web-inputs';

/**
 * The lab analyses of one ingredient side by side (imported from files or typed in on the ingredient's
 * page), as fed or on dry matter, estimates marked, values that did not go into the library marked.
 */
export function LabAnalysesHistoryScreen() {
  const params = useLocalSearchParams<{ ingredient?: string }>();
  const initial = Number(params.ingredient);
  const [ingredientId, setIngredientId] = useState<number | null>(Number.isInteger(initial) && initial > 0 ? initial : null);
  const [basis, setBasis] = useState<'as_fed' | 'dry_matter'>('as_fed');
  const targets = useLabTargetIngredientsQuery();
  const analyses = useIngredientAnalysesQuery(ingredientId);
  const withAnalyses = targets.data?.items.filter((t) => t.analyses > 0) ?? [];

  return (
    <Screen title="Compare lab analyses" lead="Every lab analysis of an ingredient, imported or typed in, oldest first." testID="screen-lab-history">
      <View style={styles.links}>
        <Link href="/library" testID="back-to-library"><AppText style={styles.link}>← Back to library</AppText></Link>
        <Link href="/lab-import" testID="to-lab-import"><AppText style={styles.link}>Import another file</AppText></Link>
      </View>
      {targets.error ? <ErrorState error={targets.error} onRetry={() => targets.refetch()} /> : null}
      {targets.data ? (
        withAnalyses.length ? (
          <Select label="Ingredient" value={String(ingredientId ?? '')} onChange={(v) => setIngredientId(v ? Number(v) : null)} options={[{ value: '', label: 'Choose an ingredient…' }, ...withAnalyses.map((t) => ({ value: String(t.id), label: `${t.name} (${t.analyses})` }))]} testID="history-ingredient" />
        ) : (
          <AppText muted>No lab analysis has been recorded yet.</AppText>
        )
      ) : null}
      <ChoiceChips label="Show values" value={basis} onChange={setBasis} options={[{ value: 'as_fed', label: 'As fed' }, { value: 'dry_matter', label: 'On dry matter' }]} testID="history-basis" />
      {analyses.error ? <ErrorState error={analyses.error} onRetry={() => analyses.refetch()} /> : null}
      {analyses.data ? <Comparison data={analyses.data} basis={basis} /> : null}
    </Screen>
  );
}

function Comparison({ data, basis }: { data: IngredientAnalyses; basis: 'as_fed' | 'dry_matter' }) {
  const ids = data.catalogue.map((n) => n.id).filter((id) => data.analyses.some((a) => a.values.some((v) => v.nutrientId === id)));
  return (
    <View style={styles.block} testID="history-table">
      <AppText variant="title">{data.ingredient.name}</AppText>
      <CautionBanner compact />
      <ScrollView horizontal>
        <View>
          <View style={styles.row}>
            <AppText variant="label" style={styles.nameCell}>Nutrient</AppText>
            {data.analyses.map((a) => (
              <View key={a.id} style={styles.cell}>
                <AppText variant="label">{a.analysedOn}</AppText>
                <AppText variant="caption" muted>{[a.sampleId, a.labName].filter(Boolean).join(' · ')}</AppText>
                <AppText variant="caption" muted testID={`history-entry-${a.id}`}>
                  {a.entry === 'typed' ? 'typed in' : 'imported'}
                  {a.recordedBy ? ` by ${a.recordedBy}` : ''}
                </AppText>
              </View>
            ))}
          </View>
          {ids.map((id) => {
            const nutrient = data.catalogue.find((n) => n.id === id)!;
            return (
              <View key={id} style={styles.row} testID={`history-row-${id}`}>
                <AppText variant="small" style={styles.nameCell}>{nutrient.name}</AppText>
                {data.analyses.map((a) => {
                  const v = a.values.find((x) => x.nutrientId === id);
                  const shown = v ? (basis === 'as_fed' ? v.asFed : v.dryMatter) : null;
                  return (
                    <View key={a.id} style={styles.cell}>
                      {v && shown !== null ? (
                        <>
                          <AppText variant="small">{formatValue(shown, nutrient.unit)} {nutrient.unit}</AppText>
                          {v.origin !== 'measured' ? <AppText variant="caption" style={styles.estimate}>{v.origin === 'override' ? 'entered' : v.origin}{v.method ? `: ${v.method.name}` : ''}</AppText> : null}
                          {!a.applied.includes(id) ? <AppText variant="caption" muted>not applied: a later-dated analysis held it</AppText> : null}
                        </>
                      ) : (
                        <AppText variant="small" muted>—</AppText>
                      )}
                    </View>
                  );
                })}
              </View>
            );
          })}
        </View>
      </ScrollView>
    </View>
  );
}

const styles = StyleSheet.create({
  links: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  link: { color: colors.brand, textDecorationLine: 'underline' },
  block: { gap: space.md },
  row: { flexDirection: 'row', borderBottomWidth: 1, borderBottomColor: colors.paperSunken, paddingVertical: space.xs },
  nameCell: { width: 170, paddingRight: space.sm },
  cell: { width: 150, paddingRight: space.sm },
  estimate: { color: colors.caution },
});
