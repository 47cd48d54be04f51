import { useState } from 'react';
import { Pressable, StyleSheet, useWindowDimensions, View } from 'react-native';
import { Link, useRouter } from 'expo-router';

import { useSpeciesQuery, useSpecificationsQuery } from '@/api/requirements';
import { useActiveMembership } from '@/api/session';
import { ErrorState } from '@/components/error-state';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { AppText } from '@/components/ui/text';
import type { LibraryName } from '@/shared/library-terms';
import type { SpecificationSummary } from '@/shared/schemas/specifications';
import { colors, radius, space, TOUCH_MIN, WIDE_MIN_WIDTH } from '@/theme';

const LIBRARY_OPTIONS = [
  { value: 'reference' as const, label: 'Reference tables' },
  { value: 'own' as const, label: 'Ours' },
];

export function RequirementsScreen() {
  const { width } = useWindowDimensions();
  const wide = width >= WIDE_MIN_WIDTH;
  const router = useRouter();
  const { can } = useActiveMembership();
  const [library, setLibrary] = useState<LibraryName>('reference');
  const [speciesId, setSpeciesId] = useState<string>('all');
  const species = useSpeciesQuery();
  const list = useSpecificationsQuery({ library, speciesId: speciesId === 'all' ? undefined : Number(speciesId) });
  const speciesOptions = [{ value: 'all', label: 'All species' }, ...(species.data?.items ?? []).map((s) => ({ value: String(s.id), label: s.name }))];

  return (
    <Screen title="Requirements" lead="Nutrient specifications per species and production phase." testID="screen-requirements">
      <Button
        label={can('requirements:write') ? 'Species and phases: add your own' : 'Species and phases'}
        tone="quiet"
        onPress={() => router.push('/requirements/species')}
        testID="species-open"
      />
      <ChoiceChips label="Specifications" options={LIBRARY_OPTIONS} value={library} onChange={setLibrary} testID="spec-library" />
      <ChoiceChips label="Species" options={speciesOptions} value={speciesId} onChange={setSpeciesId} testID="spec-species" />
      {species.isError ? <ErrorState error={species.error} onRetry={() => species.refetch()} /> : null}
      {list.isError ? <ErrorState error={list.error} onRetry={() => list.refetch()} /> : null}
      {list.data?.items.length === 0 ? (
        <AppText testID="spec-empty">{library === 'own' ? 'No specifications of our own yet. Open a reference specification and choose “Copy and adjust”.' : 'No reference specification for this species yet.'}</AppText>
      ) : null}
      {list.data ? (wide ? <SpecTable items={list.data.items} /> : <SpecCards items={list.data.items} />) : list.isPending ? <AppText muted>Loading…</AppText> : null}
    </Screen>
  );
}

function SpecTable({ items }: { items: SpecificationSummary[] }) {
  if (items.length === 0) return null;
  return (
    <View style={styles.table} testID="spec-table" role="table">
      <View style={[styles.row, styles.head]} role="row">
        <AppText variant="label" style={styles.wide}>Specification</AppText>
        <AppText variant="label" style={styles.mid}>Species and phase</AppText>
        <AppText variant="label" style={styles.wide}>Source</AppText>
        <AppText variant="label" style={styles.narrow}>Bounds</AppText>
      </View>
      {items.map((s) => (
        <Link key={s.id} href={`/requirements/${s.id}`} asChild>
          <Pressable style={styles.row} role="row" testID={`spec-row-${s.id}`}>
            <AppText style={styles.wide}>{s.name}</AppText>
            <AppText style={styles.mid}>{s.species.name}{s.phase ? ` · ${s.phase.span ?? s.phase.name}` : ''}</AppText>
            <AppText variant="small" muted style={styles.wide}>{s.source}</AppText>
            <AppText style={styles.narrow}>{s.boundCount}</AppText>
          </Pressable>
        </Link>
      ))}
    </View>
  );
}

function SpecCards({ items }: { items: SpecificationSummary[] }) {
  return (
    <View style={styles.cards} testID="spec-cards">
      {items.map((s) => (
        <Link key={s.id} href={`/requirements/${s.id}`} asChild>
          <Pressable style={styles.card} testID={`spec-card-${s.id}`}>
            <AppText variant="label">{s.name}</AppText>
            <AppText variant="small">{s.species.name}{s.phase ? ` · ${s.phase.span ?? s.phase.name}` : ''}</AppText>
            <AppText variant="caption" muted>{s.source}</AppText>
          </Pressable>
        </Link>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  table: { borderWidth: 1, borderColor: colors.rule, borderRadius: radius.md, backgroundColor: colors.paperRaised, overflow: 'hidden' },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.md, minHeight: TOUCH_MIN, paddingHorizontal: space.md, paddingVertical: space.sm, borderTopWidth: 1, borderTopColor: colors.rule },
  head: { borderTopWidth: 0, backgroundColor: colors.paperSunken },
  wide: { flex: 3 },
  mid: { flex: 2 },
  narrow: { flex: 1, textAlign: 'right' },
  cards: { gap: space.md },
  card: { gap: space.xs, padding: space.lg, minHeight: TOUCH_MIN, borderRadius: radius.lg, backgroundColor: colors.paperRaised, borderWidth: 1, borderColor: colors.rule },
});
