import { Pressable, StyleSheet, View } from 'react-native';
import { useRouter } from 'expo-router';

import { useApprovedFormulasQuery } from '@/api/formulas';
import { ErrorState } from '@/components/error-state';
import { Screen } from '@/components/screen';
import { AppText, Figure } from '@/components/ui/text';
import { useUnits } from '@/lib/measures-format';
import { colors, radius, space } from '@/theme';

import { when } from './format';

/** What a mill operator sees: the approved version of each formula; each opens as a batch sheet. */
export function ApprovedFormulas() {
  const approved = useApprovedFormulasQuery();
  const router = useRouter();
  const units = useUnits();
  return (
    <Screen title="Approved formulas" lead="The versions a nutritionist approved for mixing. All amounts as fed." testID="screen-formulas">
      {approved.isPending ? <AppText muted>Loading…</AppText> : null}
      {approved.isError ? <ErrorState error={approved.error} onRetry={() => approved.refetch()} /> : null}
      {approved.data?.length === 0 ? <AppText muted>No formula has been approved yet.</AppText> : null}
      <View style={styles.list} testID="approved-list">
        {approved.data?.map((a) => (
          <Pressable key={a.version.id} role="link" onPress={() => router.push(`/batch-sheet/${a.version.id}`)} style={styles.row} testID={`approved-${a.formulaId}`}>
            <View style={styles.rowMain}>
              <AppText variant="lead" style={styles.name}>{a.formulaName}</AppText>
              <AppText variant="small" muted>{a.species?.name ?? ''} · version {a.version.number}, approved by {a.version.approvedBy} {when(a.version.approvedAt)}</AppText>
            </View>
            <Figure value={units.massOf(a.batchKg).toFixed(0)} unit={`${units.mass} batch`} />
          </Pressable>
        ))}
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, justifyContent: 'space-between', padding: space.lg, borderRadius: radius.lg, backgroundColor: colors.paperRaised, borderWidth: 1, borderColor: colors.rule },
  rowMain: { flex: 1, minWidth: 200, gap: space.xs },
  name: { color: colors.brand, fontWeight: '600' },
});
