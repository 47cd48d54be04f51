import { useMemo, useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { ChoiceChips } from '@/components/ui/choice-chips';
import { TextField } from '@/components/ui/text-field';
import { AppText, Figure } from '@/components/ui/text';
import { useUnits } from '@/lib/measures-format';
import { INGREDIENT_CATEGORY_LABELS } from '@/shared/library-terms';
import type { IngredientChoice } from '@/shared/schemas/formulas';
import { colors, radius, space, TOUCH_MIN } from '@/theme';

type Filter = 'all' | 'insect' | 'selected';

/**
 * Picks ingredients from the organization's library: a search box and a filter chip that brings the
 * insect meals to the top. An ingredient the insect-protein rule keeps out of this species' diets is
 * shown with the reason and cannot be picked.
 */
export function IngredientPicker({ choices, selected, onToggle }: { choices: IngredientChoice[]; selected: number[]; onToggle: (choice: IngredientChoice) => void }) {
  const units = useUnits();
  const [search, setSearch] = useState('');
  const [filter, setFilter] = useState<Filter>('all');
  const shown = useMemo(() => {
    const words = search.trim().toLowerCase();
    return choices
      .filter((c) => (filter === 'insect' ? c.category === 'insect_meal' : filter === 'selected' ? selected.includes(c.id) : true))
      .filter((c) => !words || c.name.toLowerCase().includes(words))
      .slice(0, 60);
  }, [choices, search, filter, selected]);
  return (
    <View style={styles.wrap}>
      <TextField label="Find an ingredient" value={search} onChangeText={setSearch} placeholder="e.g. maize, soybean, larvae" testID="picker-search" />
      <ChoiceChips<Filter>
        label="Show"
        value={filter}
        onChange={setFilter}
        testID="picker-filter"
        options={[
          { value: 'all', label: `All (${choices.length})` },
          { value: 'insect', label: `Insect meals (${choices.filter((c) => c.category === 'insect_meal').length})` },
          { value: 'selected', label: `Chosen (${selected.length})` },
        ]}
      />
      <View style={styles.list}>
        {shown.map((c) => {
          const on = selected.includes(c.id);
          const refused = !c.offered.allowed;
          return (
            <Pressable
              key={c.id}
              role="checkbox"
              aria-checked={on}
              aria-disabled={refused}
              disabled={refused && !on}
              onPress={() => onToggle(c)}
              testID={`pick-${c.id}`}
              style={[styles.item, on && styles.itemOn, refused && styles.itemRefused]}
            >
              <View style={styles.itemText}>
                <AppText variant="small" style={on ? styles.textOn : undefined}>{on ? '✓ ' : ''}{c.name}</AppText>
                <AppText variant="caption" muted>{INGREDIENT_CATEGORY_LABELS[c.category]}</AppText>
                {refused ? <AppText variant="caption" style={styles.refused}>{c.offered.message}</AppText> : null}
              </View>
              {c.pricePerKg !== null ? <Figure value={units.priceOf(c.pricePerKg).toFixed(4)} unit={`${units.currency} per ${units.mass}`} /> : <AppText variant="caption" muted>no price</AppText>}
            </Pressable>
          );
        })}
        {shown.length === 0 ? <AppText muted>Nothing matches. Clear the search or choose another filter.</AppText> : null}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.md },
  list: { gap: space.xs },
  item: { minHeight: TOUCH_MIN, flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: space.md, paddingHorizontal: space.md, paddingVertical: space.sm, borderRadius: radius.md, borderWidth: 1, borderColor: colors.rule, backgroundColor: colors.paperRaised },
  itemOn: { borderColor: colors.brand, backgroundColor: colors.brandSoft },
  itemRefused: { backgroundColor: colors.paperSunken },
  itemText: { flex: 1, gap: 2 },
  textOn: { color: colors.brand, fontWeight: '600' },
  refused: { color: colors.danger },
});
