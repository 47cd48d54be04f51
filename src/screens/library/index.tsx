import { useState } from 'react';
import { Pressable, StyleSheet, useWindowDimensions, View } from 'react-native';
import { Link, useRouter } from 'expo-router';

import { useIngredientsQuery, useReferenceLibraryCopyMutation } from '@/api/ingredients';
import { useActiveMembership } from '@/api/session';
import { CautionBanner } from '@/components/caution-banner';
import { ErrorState } from '@/components/error-state';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { TextField } from '@/components/ui/text-field';
import { AppText, Figure } from '@/components/ui/text';
import { INGREDIENT_CATEGORIES, INGREDIENT_CATEGORY_LABELS, INSECT_SPECIES_LABELS, type IngredientCategory, type LibraryName, type NutrientUnit } from '@/shared/library-terms';
import type { IngredientSummary } from '@/shared/schemas/ingredients';
import { valueOnBasis, type CompositionBasis } from '@/shared/units';
import { colors, radius, space, TOUCH_MIN, WIDE_MIN_WIDTH } from '@/theme';

import { BasisToggle } from './basis-toggle';
import { useUnits } from '@/lib/measures-format';

import { formatPrice, formatValue } from './format';

const PAGE_SIZE = 25;

/** Columns of the wide table and the lines of a phone card. */
const COLUMNS: { id: string; label: string; unit: NutrientUnit }[] = [
  { id: 'dm', label: 'DM', unit: '%' },
  { id: 'cp', label: 'CP', unit: '%' },
  { id: 'ee', label: 'Fat', unit: '%' },
  { id: 'cf', label: 'Fibre', unit: '%' },
  { id: 'ca', label: 'Ca', unit: '%' },
  { id: 'p', label: 'P', unit: '%' },
  { id: 'amen_poultry', label: 'AMEn', unit: 'kcal/kg' },
  { id: 'ne_swine', label: 'NE pig', unit: 'kcal/kg' },
];

const LIBRARY_OPTIONS = [
  { value: 'own' as const, label: 'Our library' },
  { value: 'reference' as const, label: 'Reference tables' },
];
const CATEGORY_OPTIONS = [{ value: 'all' as const, label: 'All' }, ...INGREDIENT_CATEGORIES.map((c) => ({ value: c, label: INGREDIENT_CATEGORY_LABELS[c] }))];

function shown(item: IngredientSummary, id: string, basis: CompositionBasis): number | undefined {
  const value = item.values[id];
  const dm = item.values.dm;
  if (value === undefined) return undefined;
  if (basis === 'dry_matter' && !dm) return undefined;
  return valueOnBasis(value, dm ?? 100, basis, id);
}

export function LibraryScreen() {
  const { width } = useWindowDimensions();
  const wide = width >= WIDE_MIN_WIDTH;
  const router = useRouter();
  const units = useUnits();
  const { can } = useActiveMembership();
  const [library, setLibrary] = useState<LibraryName>('own');
  const [category, setCategory] = useState<IngredientCategory | 'all'>('all');
  const [search, setSearch] = useState('');
  const [page, setPage] = useState(1);
  const [basis, setBasis] = useState<CompositionBasis>('as_fed');
  const list = useIngredientsQuery({ library, search: search.trim() || undefined, category: category === 'all' ? undefined : category, page, pageSize: PAGE_SIZE });
  const pages = list.data ? Math.max(1, Math.ceil(list.data.total / PAGE_SIZE)) : 1;

  return (
    <Screen title="Library" lead="Your ingredients, their nutrient values and prices." testID="screen-library">
      {can('library:write') || can('lab:import') ? (
        <View style={styles.actions}>
          {can('library:write') ? <Button label="New ingredient" onPress={() => router.push('/library/new')} testID="ingredient-new" /> : null}
          {can('library:write') ? <Button label="Update prices" tone="quiet" onPress={() => router.push('/library/prices')} testID="prices-open" /> : null}
          {can('lab:import') ? <Button label="Import a lab analysis (CSV)" tone="quiet" onPress={() => router.push('/lab-import')} testID="lab-import-open" /> : null}
        </View>
      ) : null}
      <View style={[styles.filters, wide && styles.filtersWide]}>
        <ChoiceChips label="Library" options={LIBRARY_OPTIONS} value={library} onChange={(v) => { setLibrary(v); setPage(1); }} testID="library-choice" />
        <BasisToggle value={basis} onChange={setBasis} />
      </View>
      <TextField label="Search" hint="by name" value={search} onChangeText={(t) => { setSearch(t); setPage(1); }} placeholder="e.g. soybean, larvae" testID="ingredient-search" />
      <ChoiceChips label="Category" options={CATEGORY_OPTIONS} value={category} onChange={(v) => { setCategory(v); setPage(1); }} testID="category" />
      {list.isError ? <ErrorState error={list.error} onRetry={() => list.refetch()} /> : null}
      {list.data ? (
        <>
          <AppText muted testID="ingredient-count">
            {list.data.total} {list.data.total === 1 ? 'ingredient' : 'ingredients'}{basis === 'dry_matter' ? ', values per kg of dry matter' : ', values per kg as fed'}
          </AppText>
          {units.system === 'us' ? <AppText variant="caption" muted testID="per-kg-note">Nutrient and energy values stay per kg (%, g/kg, kcal/kg): they are concentrations. Prices are per lb.</AppText> : null}
          {list.data.items.length === 0 ? <EmptyLibrary own={library === 'own' && !search.trim() && category === 'all'} canWrite={can('library:write')} /> : null}
          {wide ? <IngredientTable items={list.data.items} basis={basis} /> : <IngredientCards items={list.data.items} basis={basis} />}
          {pages > 1 ? (
            <View style={styles.actions}>
              <Button label="Previous" tone="quiet" disabled={page <= 1} onPress={() => setPage(page - 1)} testID="page-previous" />
              <AppText style={styles.pageLabel}>Page {page} of {pages}</AppText>
              <Button label="Next" tone="quiet" disabled={page >= pages} onPress={() => setPage(page + 1)} testID="page-next" />
            </View>
          ) : null}
        </>
      ) : list.isPending ? <AppText muted>Loading ingredients…</AppText> : null}
      <CautionBanner compact />
    </Screen>
  );
}

function EmptyLibrary({ own, canWrite }: { own: boolean; canWrite: boolean }) {
  const copy = useReferenceLibraryCopyMutation();
  if (!own) return <AppText>No ingredient matches. Clear the search or choose another category.</AppText>;
  return (
    <View style={styles.filters} testID="library-empty">
      <AppText>Our library is empty. Start from the reference tables and then adjust prices and values to your own supplies.</AppText>
      {canWrite ? <Button label={copy.isPending ? 'Copying…' : 'Copy the reference tables'} disabled={copy.isPending} onPress={() => copy.mutate()} testID="library-copy-reference" /> : null}
      {copy.isError ? <ErrorState error={copy.error} /> : null}
    </View>
  );
}

function Badges({ item }: { item: IngredientSummary }) {
  return (
    <View style={styles.badges}>
      {item.insect ? <AppText variant="caption" style={[styles.badge, styles.insectBadge]}>{INSECT_SPECIES_LABELS[item.insect.species].split(' (')[0]}</AppText> : null}
      {item.refusals.map((r) => (
        <AppText key={r.family} variant="caption" style={[styles.badge, styles.refusedBadge]}>Not for {r.family === 'swine' ? 'pigs' : 'poultry'}</AppText>
      ))}
    </View>
  );
}

function IngredientTable({ items, basis }: { items: IngredientSummary[]; basis: CompositionBasis }) {
  const units = useUnits();
  return (
    <View style={styles.table} testID="ingredient-table" role="table">
      <View style={[styles.row, styles.headRow]} role="row">
        <AppText variant="label" style={styles.nameCell} role="columnheader">Ingredient</AppText>
        {COLUMNS.map((c) => (
          <AppText key={c.id} variant="label" style={styles.numCell} role="columnheader">{c.label} <AppText variant="caption" muted>{c.id === 'dm' && basis === 'dry_matter' ? '%' : c.unit}</AppText></AppText>
        ))}
        <AppText variant="label" style={styles.numCell} role="columnheader">Price <AppText variant="caption" muted testID="price-unit">{units.currency} per {units.mass}</AppText></AppText>
      </View>
      {items.map((item) => (
        <Link key={item.id} href={`/library/${item.id}`} asChild>
          <Pressable style={styles.row} role="row" testID={`ingredient-row-${item.id}`}>
            <View style={styles.nameCell}>
              <AppText>{item.name}</AppText>
              <AppText variant="caption" muted>{INGREDIENT_CATEGORY_LABELS[item.category]}</AppText>
              <Badges item={item} />
            </View>
            {COLUMNS.map((c) => (
              <AppText key={c.id} style={[styles.numCell, styles.figure]}>{formatValue(shown(item, c.id, basis), c.unit)}</AppText>
            ))}
            <AppText style={[styles.numCell, styles.figure]}>{formatPrice(item.pricePerKg, units)}</AppText>
          </Pressable>
        </Link>
      ))}
    </View>
  );
}

function IngredientCards({ items, basis }: { items: IngredientSummary[]; basis: CompositionBasis }) {
  const units = useUnits();
  return (
    <View style={styles.cards} testID="ingredient-cards">
      {items.map((item) => (
        <Link key={item.id} href={`/library/${item.id}`} asChild>
          <Pressable style={styles.card} testID={`ingredient-card-${item.id}`}>
            <AppText variant="label">{item.name}</AppText>
            <AppText variant="caption" muted>{INGREDIENT_CATEGORY_LABELS[item.category]}</AppText>
            <Badges item={item} />
            <View style={styles.cardFigures}>
              {COLUMNS.slice(1, 6).map((c) => (
                <View key={c.id} style={styles.cardFigure}>
                  <AppText variant="caption" muted>{c.label}</AppText>
                  <Figure value={formatValue(shown(item, c.id, basis), c.unit)} unit={c.unit} />
                </View>
              ))}
              <View style={styles.cardFigure}>
                <AppText variant="caption" muted>Price</AppText>
                <Figure value={formatPrice(item.pricePerKg, units)} unit={item.pricePerKg === null ? '' : `${units.currency}/${units.mass}`} />
              </View>
            </View>
          </Pressable>
        </Link>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'center' },
  filters: { gap: space.md },
  filtersWide: { flexDirection: 'row', gap: space.xl },
  pageLabel: { paddingHorizontal: space.sm },
  table: { borderWidth: 1, borderColor: colors.rule, borderRadius: radius.md, backgroundColor: colors.paperRaised, overflow: 'hidden' },
  row: { flexDirection: 'row', alignItems: 'center', minHeight: TOUCH_MIN, paddingHorizontal: space.md, paddingVertical: space.sm, borderTopWidth: 1, borderTopColor: colors.rule, gap: space.sm },
  headRow: { borderTopWidth: 0, backgroundColor: colors.paperSunken },
  nameCell: { flex: 3, gap: 2 },
  numCell: { flex: 1, textAlign: 'right' },
  figure: { fontVariant: ['tabular-nums'] },
  badges: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs },
  badge: { paddingHorizontal: space.sm, borderRadius: radius.sm, overflow: 'hidden' },
  insectBadge: { backgroundColor: colors.accentSoft, color: colors.ink },
  refusedBadge: { backgroundColor: colors.dangerSoft, color: colors.danger },
  cards: { gap: space.md },
  card: { gap: space.xs, padding: space.lg, minHeight: TOUCH_MIN, borderRadius: radius.lg, backgroundColor: colors.paperRaised, borderWidth: 1, borderColor: colors.rule },
  cardFigures: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, marginTop: space.xs },
  cardFigure: { minWidth: 88 },
});
