import { StyleSheet, View } from 'react-native';

import { CautionBanner } from '@/components/caution-banner';
import { NutrientChart, type NutrientChartRow } from '@/components/charts/nutrient-chart';
import { Card } from '@/components/ui/card';
import { AppText, Figure } from '@/components/ui/text';
import type { Units } from '@/lib/measures-format';
import { stepDecimals } from '@/shared/measures';
import type { MixLine, OptimalResult } from '@/shared/schemas/formulation';
import type { FormulaSolve } from '@/shared/schemas/formulas';
import { colors, fonts, space } from '@/theme';

import { kg, money, pct } from './format';

/** Prices per kg (or per lb) have four decimals: a tenth of a cent per lb changes a mix. */
const price = (units: Units, perKg: number) => units.priceOf(perKg).toFixed(4);

/** A result: caution first, then the mix, the chart and the explanations; infeasible results say what to relax. */
export function ResultPanel({ solve, heading, units }: { solve: FormulaSolve; heading: string; units: Units }) {
  const r = solve.result;
  return (
    <View style={styles.wrap} testID="formula-result">
      <CautionBanner />
      <AppText variant="small" muted testID="result-heading">{heading} · basis: as fed{solve.specification ? ` · ${solve.specification.name}` : ''}</AppText>
      {solve.capWarnings.map((w) => (
        <View key={w.label} style={styles.warning} accessibilityRole="alert" testID="cap-warning">
          <AppText variant="small">{w.message}</AppText>
        </View>
      ))}
      {r.status === 'optimal' ? <Optimal solve={solve} result={r} units={units} /> : null}
      {r.status === 'infeasible' ? (
        <Card title="No mix meets these bounds" testID="infeasible-advice" style={styles.infeasible}>
          <AppText>{r.message}</AppText>
          {r.relaxations.length ? (
            <View style={styles.list}>
              <AppText variant="label">The least change that makes a mix possible:</AppText>
              {r.relaxations.map((x) => (
                <AppText key={x.constraint} testID="relaxation">• {x.message}</AppText>
              ))}
            </View>
          ) : (
            <AppText>No single change was found. Check that the chosen ingredients can supply every nutrient with a minimum, and that the inclusion minimums add up to less than 100 %.</AppText>
          )}
          {r.conflict.length ? <AppText variant="small" muted>Bounds that pull against each other here: {conflictWords(r.conflict, solve)}.</AppText> : null}
          {r.closestMix ? (
            <AppText variant="small" muted>
              With those changes the cheapest mix would cost {units.money(r.closestMix.costPerBatch, 2)} per batch of {units.massText(solve.problem.batchKg)}. It does not meet the bounds as set and must not be made.
            </AppText>
          ) : null}
        </Card>
      ) : null}
      {r.status === 'failed' || r.status === 'unbounded' || r.status === 'invalid' ? (
        <Card title="No result" testID="failed-result" style={styles.infeasible}>
          <AppText>{r.message} No mix is shown: nothing unchecked is ever reported.</AppText>
        </Card>
      ) : null}
    </View>
  );
}

function Optimal({ solve, result, units }: { solve: FormulaSolve; result: OptimalResult; units: Units }) {
  const names = new Map(solve.ingredients.map((u) => [String(u.ingredientId), u]));
  const info = new Map(solve.nutrients.map((n) => [n.id, n]));
  const chartRows: NutrientChartRow[] = result.nutrients.map((n) => ({ id: n.id, name: info.get(n.id)?.name ?? n.name ?? n.id, unit: info.get(n.id)?.unit ?? n.unit ?? '', value: n.value, min: n.min, max: n.max, binding: n.binding }));
  const binding = result.nutrients.filter((n) => n.binding);
  const ratios = result.ratios.filter((x) => x.binding);
  const perTonne = (v: number) => `${units.money(units.costOf(v), 2)} per ${units.tonneWord}`;
  const limits = [...result.groups.filter((g) => g.binding).map((g) => ({ id: g.id, name: g.name ?? g.id, side: g.binding, per: g.shadowPricePerTonnePerPercent })), ...result.inclusions.filter((i) => i.binding).map((i) => ({ id: i.id, name: names.get(i.id)?.name ?? i.id, side: i.binding, per: i.shadowPricePerTonnePerPercent }))];
  return (
    <>
      <Card title={`Cost in ${units.currency}`} testID="result-cost">
        {/* The currency code sits before each amount, outside the figure, so the figure reads "312.00 per tonne". */}
        <View style={styles.figures}>
          <View style={styles.money}>
            <AppText style={styles.currency}>{units.currency}</AppText>
            <Figure value={money(units.costOf(result.costPerTonne))} unit={`per ${units.tonneWord}`} testID="cost-per-tonne" style={styles.big} />
          </View>
          <View style={styles.money}>
            <AppText style={styles.currency}>{units.currency}</AppText>
            <Figure value={money(result.costPerBatch)} unit={`per batch of ${units.massText(result.batchKg)}`} testID="cost-per-batch" />
          </View>
        </View>
      </Card>
      <Card title="Mix" testID="mix-table">
        <MixTable mix={result.mix} insect={(id) => names.get(id)?.insectSpecies != null} total={result.costPerBatch} units={units} />
      </Card>
      <Card title="Nutrients against their bounds">
        <NutrientChart rows={chartRows} />
      </Card>
      <Card title="What drives the cost" testID="binding-bounds">
        {binding.length + ratios.length + limits.length === 0 ? <AppText>No bound binds: the mix is the cheapest of the chosen ingredients within their limits.</AppText> : null}
        {binding.map((n) => (
          <AppText key={n.id} testID="shadow-price">
            • {info.get(n.id)?.name ?? n.id} is at its {n.binding === 'min' ? 'minimum' : 'maximum'}. {n.readable
              ? `Each ${n.readable.step.toFixed(stepDecimals(n.readable.step))} ${n.readable.unit} more ${info.get(n.id)?.name ?? n.id} ${n.binding === 'max' ? 'allowed' : 'required'} ${n.readable.costPerTonne >= 0 ? 'adds' : 'saves'} ${perTonne(Math.abs(n.readable.costPerTonne))} of feed.`
              : `Each unit more costs ${perTonne(n.shadowPricePerTonne)}.`}
          </AppText>
        ))}
        {ratios.map((x) => (
          <AppText key={x.id} testID="shadow-price">
            • The ratio {info.get(x.numerator)?.name ?? x.numerator} : {info.get(x.denominator)?.name ?? x.denominator} is at its {x.binding === 'min' ? 'minimum' : 'maximum'} ({x.value?.toFixed(2)}). Raising that bound by 0.1 would {x.shadowPricePerTonne >= 0 ? 'add' : 'save'} {perTonne(Math.abs(x.shadowPricePerTonne * 0.1))}.
          </AppText>
        ))}
        {limits.map((l) => (
          <AppText key={`l-${l.id}`} testID="shadow-price">
            • {l.name} is at its {l.side === 'min' ? 'minimum' : 'maximum'} inclusion. Each 1 % of the batch more allowed would {l.per >= 0 ? 'add' : 'save'} {perTonne(Math.abs(l.per))}.
          </AppText>
        ))}
      </Card>
      <Card title={`Price ranging (${units.currency} per ${units.mass} as fed)`} testID="ranging-table">
        <AppText variant="small" muted>In the mix: the price band within which the mix stays the same. Left out: the price at or below which it would enter.</AppText>
        <View style={styles.tableHead}>
          <AppText variant="label" style={styles.cellName}>Ingredient</AppText>
          <AppText variant="label" style={styles.cellNum}>Price</AppText>
          <AppText variant="label" style={styles.cellWide}>Band or entering price</AppText>
        </View>
        {result.ranging.map((g) => (
          <View key={g.id} style={styles.tableRow}>
            <AppText variant="small" style={styles.cellName}>{names.get(g.id)?.name ?? g.id}</AppText>
            <AppText variant="small" style={[styles.cellNum, styles.mono]}>{price(units, g.pricePerKg)}</AppText>
            <AppText variant="small" style={[styles.cellWide, styles.mono]}>
              {g.inMix
                ? 'fixed' in g
                  ? 'fixed amount'
                  : `in mix: ${g.lowPrice === null ? 'any lower' : price(units, g.lowPrice)} to ${g.highPrice === null ? 'any higher' : price(units, g.highPrice)}`
                : g.entersAtPrice === null
                  ? 'left out at any price (its limits)'
                  : `enters at ${price(units, g.entersAtPrice)} or less`}
            </AppText>
          </View>
        ))}
      </Card>
      {result.uniqueMix ? null : <AppText variant="small" muted>Another mix has the same cost; this is one of them.</AppText>}
    </>
  );
}

/** The engine's bound paths (`nutrients[cp].min`, `groups[group-1].maxKg`…) in words. */
function conflictWords(paths: string[], solve: FormulaSolve): string {
  const nutrient = new Map(solve.nutrients.map((n) => [n.id, n.name]));
  const ingredient = new Map(solve.ingredients.map((u) => [String(u.ingredientId), u.name]));
  const group = new Map((solve.problem.groups ?? []).map((g) => [g.id, g.name ?? g.id]));
  const side = (s: string) => (/min/i.test(s) ? 'minimum' : /max|stock|fixed/i.test(s) ? 'maximum' : s);
  return paths
    .map((p) => {
      const m = /^(\w+)\[([^\]]+)\]\.(\w+)$/.exec(p);
      if (p === 'batchKg') return 'the batch size';
      if (!m) return p;
      const [, kind, id, which] = m;
      if (kind === 'nutrients') return `${nutrient.get(id) ?? id} ${side(which)}`;
      if (kind === 'ratios') return `${id.split(':').map((n) => nutrient.get(n) ?? n).join(' : ')} ratio ${side(which)}`;
      if (kind === 'groups') return `${group.get(id) ?? id} ${side(which)}`;
      if (kind === 'ingredients') return `${ingredient.get(id) ?? id} ${side(which)}`;
      return p;
    })
    .join('; ');
}

/** Ingredient, % of the batch, kg (or lb) per batch and share of the cost. */
export function MixTable({ mix, insect, total, units }: { mix: MixLine[]; insect: (id: string) => boolean; total: number; units: Units }) {
  const rows = [...mix].sort((a, b) => b.kg - a.kg);
  return (
    <View>
      <View style={styles.tableHead}>
        <AppText variant="label" style={styles.cellName}>Ingredient</AppText>
        <AppText variant="label" style={styles.cellNum}>%</AppText>
        <AppText variant="label" style={styles.cellNum}>{units.mass}</AppText>
        <AppText variant="label" style={styles.cellNum}>cost %</AppText>
      </View>
      {rows.map((m) => (
        <View key={m.id} style={styles.tableRow} testID={`mix-row-${m.id}`}>
          <AppText variant="small" style={[styles.cellName, insect(m.id) && styles.insect]}>{m.name ?? m.id}{insect(m.id) ? ' (insect meal)' : ''}</AppText>
          <AppText variant="small" style={[styles.cellNum, styles.mono]}>{pct(m.percent)}</AppText>
          <AppText variant="small" style={[styles.cellNum, styles.mono]}>{kg(units.massOf(m.kg))}</AppText>
          <AppText variant="small" style={[styles.cellNum, styles.mono]}>{total > 0 ? pct((m.cost / total) * 100, 1) : '—'}</AppText>
        </View>
      ))}
      <AppText variant="caption" muted>% of the batch, {units.mass} per batch and share of the batch cost, as fed.</AppText>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.lg },
  warning: { padding: space.md, backgroundColor: colors.cautionSoft, borderLeftWidth: 4, borderLeftColor: colors.caution, borderRadius: 8 },
  infeasible: { borderColor: colors.danger, borderWidth: 2 },
  list: { gap: space.xs },
  figures: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xl, alignItems: 'baseline' },
  money: { flexDirection: 'row', alignItems: 'baseline', gap: space.xs },
  currency: { fontFamily: fonts.textSemiBold },
  big: { fontSize: 23, fontFamily: fonts.figuresSemiBold },
  tableHead: { flexDirection: 'row', gap: space.sm, paddingBottom: space.xs, borderBottomWidth: 1, borderBottomColor: colors.rule },
  tableRow: { flexDirection: 'row', gap: space.sm, paddingVertical: space.xs, borderBottomWidth: 1, borderBottomColor: colors.paperSunken },
  cellName: { flex: 3 },
  cellNum: { flex: 1, textAlign: 'right' },
  cellWide: { flex: 3, textAlign: 'right' },
  mono: { fontFamily: fonts.figures },
  insect: { color: colors.accent, fontWeight: '600' },
});
