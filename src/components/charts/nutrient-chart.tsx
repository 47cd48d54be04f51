import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import Svg, { Circle, Line, Rect } from 'react-native-svg';

import { colors, space } from '@/theme';

import { AppText } from '../ui/text';

export type NutrientChartRow = { id: string; name: string; unit: string; value: number; min: number | null; max: number | null; binding: 'min' | 'max' | null };

const ROW_HEIGHT = 22;

/** How a level stands against its bounds, in words (also the legend). */
export function levelState(row: NutrientChartRow): 'binding' | 'short' | 'excess' | 'within' {
  const tol = 1e-6 * Math.max(1, Math.abs(row.value));
  if ((row.min !== null && row.value < row.min - tol) || (row.max !== null && row.value > row.max + tol)) return 'short';
  if (row.binding) return 'binding';
  if (row.min !== null && row.max === null && row.value > row.min * 1.1) return 'excess';
  return 'within';
}

const STATE_COLOR = { binding: colors.accent, short: colors.danger, excess: colors.inkFaint, within: colors.brand } as const;
const STATE_WORDS = { binding: 'at its bound (drives the cost)', short: 'outside its bounds', excess: 'well above its minimum', within: 'within its bounds' } as const;

export const formatLevel = (value: number, unit: string) => (unit === 'kcal/kg' || Math.abs(value) >= 100 ? value.toFixed(0) : value.toFixed(unit === '%' ? 2 : 3));

/**
 * Each nutrient's achieved level against its minimum and maximum, one row each on its own scale
 * (units differ): the shaded band is what the specification allows, the ticks are its bounds, the dot is
 * the level reached. A bound that binds is drawn in the accent colour, so a glance shows what drives the cost.
 */
export function NutrientChart({ rows, testID = 'nutrient-chart' }: { rows: NutrientChartRow[]; testID?: string }) {
  const [width, setWidth] = useState(0);
  const bounded = rows.filter((r) => r.min !== null || r.max !== null);
  return (
    <View style={styles.wrap} testID={testID} accessibilityLabel="Nutrient levels against their bounds, as fed">
      <View style={styles.legend}>
        {(['binding', 'within', 'excess'] as const).map((s) => (
          <View key={s} style={styles.legendItem}>
            <View style={[styles.swatch, { backgroundColor: STATE_COLOR[s] }]} />
            <AppText variant="caption" muted>{STATE_WORDS[s]}</AppText>
          </View>
        ))}
      </View>
      <View onLayout={(e) => setWidth(e.nativeEvent.layout.width)} style={styles.rows}>
        {width > 0
          ? bounded.map((row) => {
              const top = Math.max(row.value, row.max ?? 0, row.min ?? 0) * (row.max !== null ? 1.1 : 1.3) || 1;
              const x = (v: number) => Math.max(2, Math.min(width - 2, (v / top) * width));
              const state = levelState(row);
              const lo = row.min ?? 0;
              const hi = row.max ?? top;
              return (
                <View key={row.id} style={styles.row} testID={`nutrient-row-${row.id}`} accessibilityLabel={`${row.name}: ${formatLevel(row.value, row.unit)} ${row.unit}, ${STATE_WORDS[state]}`}>
                  <View style={styles.rowText}>
                    <AppText variant="small" style={styles.name} numberOfLines={1}>{row.name}</AppText>
                    <AppText variant="small" style={{ color: STATE_COLOR[state] }}>
                      {formatLevel(row.value, row.unit)} {row.unit}
                      <AppText variant="caption" muted>
                        {'  '}
                        {row.min !== null ? `min ${formatLevel(row.min, row.unit)}` : ''}
                        {row.min !== null && row.max !== null ? ' · ' : ''}
                        {row.max !== null ? `max ${formatLevel(row.max, row.unit)}` : ''}
                      </AppText>
                    </AppText>
                  </View>
                  <Svg width={width} height={ROW_HEIGHT}>
                    <Rect x={0} y={ROW_HEIGHT / 2 - 1} width={width} height={2} fill={colors.rule} />
                    <Rect x={x(lo)} y={4} width={Math.max(1, x(hi) - x(lo))} height={ROW_HEIGHT - 8} fill={colors.brandSoft} />
                    {row.min !== null ? <Line x1={x(row.min)} x2={x(row.min)} y1={1} y2={ROW_HEIGHT - 1} stroke={row.binding === 'min' ? colors.accent : colors.inkMuted} strokeWidth={2} /> : null}
                    {row.max !== null ? <Line x1={x(row.max)} x2={x(row.max)} y1={1} y2={ROW_HEIGHT - 1} stroke={row.binding === 'max' ? colors.accent : colors.inkMuted} strokeWidth={2} /> : null}
                    <Circle cx={x(row.value)} cy={ROW_HEIGHT / 2} r={6} fill={STATE_COLOR[state]} stroke={colors.paperRaised} strokeWidth={1.5} />
                  </Svg>
                </View>
              );
            })
          : null}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.sm },
  legend: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  legendItem: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
  swatch: { width: 10, height: 10, borderRadius: 5 },
  rows: { gap: space.sm, width: '100%' },
  row: { gap: 2 },
  rowText: { flexDirection: 'row', justifyContent: 'space-between', gap: space.sm, flexWrap: 'wrap' },
  name: { flexShrink: 1 },
});
