import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/ui/card';
import { TextField } from '@/components/ui/text-field';
import { AppText, Figure } from '@/components/ui/text';
import { useUnits } from '@/lib/measures-format';
import { SPECIES_FAMILY_LABELS } from '@/shared/library-terms';
import type { SupplyPlanDetail } from '@/shared/schemas/supply';
import { soybeanAreaForProtein } from '@/shared/supply/land-use';
import { LOCAL_RULES_NOTE } from '@/shared/supply/rules';
import { DEFAULT_SOYBEAN_CP_PCT, LARVAE_NUTRIENT_LABELS } from '@/shared/supply/substrates';
import { colors, radius, space } from '@/theme';

import { mass, massText, num, parseNumber } from './format';

/** The meal's estimated composition, per nutrient: % of dry matter, % as fed, and where each figure comes from. */
export function CompositionCard({ plan }: { plan: SupplyPlanDetail }) {
  const p = plan.plan;
  const units = useUnits();
  return (
    <Card title={p.processing.defatted ? 'Pressed meal composition' : 'Meal composition'} testID="supply-composition">
      <AppText variant="small" muted>
        {plan.mealIngredient?.labSource ? `Lab values from ${plan.mealIngredient.labSource} replace the estimate where given.` : 'Estimated from what the larvae are reared on, weighted by the larvae each stream gives. Replace it with a lab analysis once you have one.'}
      </AppText>
      <View style={styles.table}>
        <View style={[styles.tr, styles.th]}>
          <AppText variant="label" style={styles.name}>Nutrient</AppText>
          <AppText variant="label" style={styles.fig}>Dry matter</AppText>
          <AppText variant="label" style={styles.fig}>As fed</AppText>
        </View>
        {p.mealComposition.map((l) => (
          <View key={l.id} style={styles.tr} testID={`composition-${l.id}`}>
            <View style={styles.name}>
              <AppText>{LARVAE_NUTRIENT_LABELS[l.id]}{l.origin === 'lab' ? ' (lab)' : ''}</AppText>
              {l.sources.map((s, k) => (
                <AppText key={k} variant="caption" muted>{s.text}</AppText>
              ))}
            </View>
            <Figure style={styles.fig} value={num(l.dmPct, 1)} unit="% DM" />
            <Figure style={styles.fig} value={num(l.asFedPct, 1)} unit="%" />
          </View>
        ))}
      </View>
      <AppText variant="caption" muted>Meal at {num(p.processing.mealDryMatterPct, 0)} % dry matter. Crude protein of larvae is often given as N × 4.73 rather than N × 6.25; chitin nitrogen inflates N × 6.25.</AppText>
      {p.processing.defatted ? <AppText variant="small">Oil pressed out: {massText(units, p.processing.oilKg)}, counted as pure fat.</AppText> : null}
    </Card>
  );
}

/** Feed-law flags on the substrates and the insect-protein rule on the meal. */
export function RulesCard({ plan }: { plan: SupplyPlanDetail }) {
  const flagged = plan.flags.filter((f) => f.notAllowed.length > 0);
  const conditioned = plan.flags.filter((f) => f.notAllowed.length === 0 && f.conditions.length > 0);
  return (
    <Card title="Rules" testID="supply-rules">
      <AppText variant="small" muted>{LOCAL_RULES_NOTE}</AppText>
      {flagged.map((f) => (
        <View key={f.streamIndex} style={[styles.note, styles.noteDanger]} testID={`flag-${f.streamIndex}`}>
          <AppText variant="label">{f.streamName}: not allowed in {f.notAllowed.map((n) => n.jurisdiction).join(' and ')}</AppText>
          {f.notAllowed.map((n, k) => (
            <AppText key={k} variant="small">{n.jurisdiction}: {n.text} ({n.source})</AppText>
          ))}
        </View>
      ))}
      {conditioned.map((f) => (
        <View key={f.streamIndex} style={styles.note}>
          <AppText variant="label">{f.streamName}: allowed under conditions</AppText>
          {f.conditions.map((n, k) => (
            <AppText key={k} variant="small">{n.jurisdiction}: {n.text}</AppText>
          ))}
        </View>
      ))}
      <View style={[styles.note, plan.speciesRule.refused.length ? styles.noteDanger : undefined]} testID="species-rule">
        <AppText variant="label">Who may eat this meal</AppText>
        {plan.speciesRule.refused.length === 0 ? (
          <AppText variant="small">No stream came from poultry or pigs, so the insect-protein rule does not keep this meal out of any diet.</AppText>
        ) : (
          plan.speciesRule.refused.map((r) => (
            <AppText key={r.family} variant="small">Never offered to {SPECIES_FAMILY_LABELS[r.family].toLowerCase()}: {r.message}</AppText>
          ))
        )}
      </View>
    </Card>
  );
}

/** Crude protein of the meal against the soybean area that grows as much; the yield and its source can be edited. */
export function LandUseCard({ plan }: { plan: SupplyPlanDetail }) {
  const units = useUnits();
  const protein = mass(units, plan.plan.processing.mealProteinKg);
  // The soybean yield stays in t/ha and the area in ha: land area is not part of the unit settings
  // (they cover masses and money), and the yield's published sources give it per hectare.
  const [yieldText, setYieldText] = useState(String(plan.landUse.soybeanYieldTPerHa));
  const [source, setSource] = useState(plan.landUse.yieldSource);
  const y = parseNumber(yieldText);
  const valid = y !== null && Number.isFinite(y) && y > 0 && y <= 10;
  const r = valid ? soybeanAreaForProtein({ mealProteinKgPerWeek: plan.plan.processing.mealProteinKg, soybeanYieldTPerHa: y, soybeanCpPct: plan.landUse.soybeanCpPct, weeksPerYear: plan.landUse.weeksPerYear }) : null;
  return (
    <Card title="Land: the soybean it stands for" testID="supply-land-use">
      <View style={styles.stats}>
        <View style={styles.stat}>
          <AppText variant="label">Crude protein in the meal</AppText>
          <Figure value={protein.value} unit={protein.unit} testID="land-protein" />
        </View>
        <View style={styles.stat}>
          <AppText variant="label">Soybean for the same protein</AppText>
          {r ? <Figure value={num(r.soybeanHa, 1)} unit={`ha for ${r.weeksPerYear} weeks`} testID="land-hectares" /> : <AppText variant="small">Enter a yield above 0 t/ha.</AppText>}
        </View>
      </View>
      <View style={styles.stats}>
        <View style={styles.stat}>
          <TextField label="Soybean yield" hint="t/ha a year" keyboardType="decimal-pad" value={yieldText} onChangeText={setYieldText} error={valid ? undefined : 'Enter a yield above 0 and at most 10 t/ha.'} testID="land-yield" />
        </View>
        <View style={[styles.stat, styles.wideStat]}>
          <TextField label="Source of the yield" value={source} onChangeText={setSource} testID="land-source" />
        </View>
      </View>
      <AppText variant="caption" muted>
        Soybean grain at {num(plan.landUse.soybeanCpPct, 0)} % crude protein ({DEFAULT_SOYBEAN_CP_PCT.source}). This compares tonnes of crude protein only: not amino acids or
        their digestibility, not the oil and hulls a soybean crop also gives, and not the land, energy and work behind the by-products the larvae ate.
      </AppText>
    </Card>
  );
}

/** The week's headline figures. */
export function SupplyTotals({ plan }: { plan: SupplyPlanDetail }) {
  const t = plan.plan.totals;
  const p = plan.plan.processing;
  const units = useUnits();
  const items: [string, number, string][] = [
    ['By-products in', t.substrateFreshKg, 'supply-total-in'],
    ['Fresh larvae', t.larvaeFreshKg, 'supply-total-larvae'],
    [p.defatted ? 'Pressed meal' : 'Dried meal', p.mealKg, 'supply-total-meal'],
    ['Frass as taken off', t.residueAsTakenOffKg, 'supply-total-frass'],
  ];
  if (p.defatted) items.push(['Larvae oil', p.oilKg, 'supply-total-oil']);
  return (
    <View style={styles.stats}>
      {items.map(([label, kg, id]) => {
        const { value, unit } = mass(units, kg);
        return (
          <View key={id} style={styles.stat}>
            <AppText variant="label">{label}</AppText>
            <Figure value={value} unit={unit} testID={id} />
          </View>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  table: { gap: space.xs },
  tr: { flexDirection: 'row', alignItems: 'flex-start', gap: space.sm, paddingVertical: space.xs, borderBottomWidth: 1, borderBottomColor: colors.rule },
  th: { borderBottomWidth: 2 },
  name: { flex: 1, gap: 2 },
  fig: { width: 88, textAlign: 'right' },
  note: { gap: space.xs, padding: space.md, borderRadius: radius.md, backgroundColor: colors.paperSunken, borderLeftWidth: 4, borderLeftColor: colors.rule },
  noteDanger: { backgroundColor: colors.dangerSoft, borderLeftColor: colors.danger },
  stats: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  stat: { flexGrow: 1, flexBasis: 150, gap: space.xs },
  wideStat: { flexBasis: 260 },
});
