import { Platform, Pressable, StyleSheet, View } from 'react-native';
import { useRouter } from 'expo-router';

import { useApprovedFormulasQuery, useApprovedVersionQuery } from '@/api/formulas';
import { CautionBanner } from '@/components/caution-banner';
import { ErrorState } from '@/components/error-state';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { AppText, Figure } from '@/components/ui/text';
import { colors, radius, space } from '@/theme';

import { when } from './format';
import { MixTable } from './result-panel';

/** What a mill operator sees: the approved version of each formula, opened as a batch sheet. */
export function ApprovedFormulas({ sheetId }: { sheetId: number | null }) {
  const approved = useApprovedFormulasQuery();
  const router = useRouter();
  if (sheetId) return <BatchSheet versionId={sheetId} onBack={() => router.push('/')} />;
  return (
    <Screen title="Approved formulas" lead="The versions a nutritionist approved for mixing. All amounts as fed." testID="screen-formulas">
      {approved.isPending ? <AppText muted>Loading…</AppText> : null}
      {approved.isError ? <ErrorState error={approved.error} onRetry={() => approved.refetch()} /> : null}
      {approved.data?.length === 0 ? <AppText muted>No formula has been approved yet.</AppText> : null}
      <View style={styles.list} testID="approved-list">
        {approved.data?.map((a) => (
          <Pressable key={a.version.id} role="link" onPress={() => router.push(`/?sheet=${a.version.id}`)} style={styles.row} testID={`approved-${a.formulaId}`}>
            <View style={styles.rowMain}>
              <AppText variant="lead" style={styles.name}>{a.formulaName}</AppText>
              <AppText variant="small" muted>{a.species?.name ?? ''} · version {a.version.number}, approved by {a.version.approvedBy} {when(a.version.approvedAt)}</AppText>
            </View>
            <Figure value={a.batchKg.toFixed(0)} unit="kg batch" />
          </Pressable>
        ))}
      </View>
    </Screen>
  );
}

function BatchSheet({ versionId, onBack }: { versionId: number; onBack: () => void }) {
  const v = useApprovedVersionQuery(versionId);
  const s = v.data?.snapshot;
  const r = s?.result;
  return (
    <Screen title={s ? s.formulaName : 'Batch sheet'} lead={v.data ? `Version ${v.data.number}, approved by ${v.data.approvedBy} ${when(v.data.approvedAt)}` : undefined} testID="screen-batch-sheet">
      <Button label="← Approved formulas" tone="quiet" onPress={onBack} />
      {/* On the sheet and in print the caution is part of the page: it cannot be closed. */}
      <CautionBanner />
      {v.isError ? <ErrorState error={v.error} onRetry={() => v.refetch()} /> : null}
      {s && r?.status === 'optimal' ? (
        <Card title={`Mix for a batch of ${r.batchKg} kg (as fed)`} testID="batch-sheet-mix">
          <MixTable mix={r.mix} insect={(id) => s.ingredients.find((u) => String(u.ingredientId) === id)?.insectSpecies != null} total={r.costPerBatch} />
          {Platform.OS === 'web' ? <Button label="Print" tone="quiet" onPress={() => window.print()} /> : null}
        </Card>
      ) : null}
    </Screen>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, justifyContent: 'space-between', padding: space.lg, borderRadius: radius.lg, backgroundColor: colors.paperRaised, borderWidth: 1, borderColor: colors.rule },
  rowMain: { flex: 1, minWidth: 200, gap: space.xs },
  name: { color: colors.brand, fontWeight: '600' },
});
