import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import Svg, { Circle, G, Line, Polyline, Rect, Text as SvgText } from 'react-native-svg';

import type { Units } from '@/lib/measures-format';
import type { FormulaPriceSweep } from '@/shared/schemas/formulas';
import { colors, fonts, space } from '@/theme';

import { AppText } from '../ui/text';

const HEIGHT = 240;
const PAD = { left: 56, right: 48, top: 16, bottom: 40 };

function ticks(lo: number, hi: number, n = 4): number[] {
  const step = (hi - lo) / n;
  return Array.from({ length: n + 1 }, (_, i) => lo + i * step);
}

/**
 * Cost per tonne (or short ton) of the formula (line, left axis) and the inclusion of one ingredient
 * (bars, right axis, % of the batch) against that ingredient's price per kg (or per lb) as fed, in the
 * organization's currency. A dashed line marks the price at which it enters the mix (or, when a minimum or the
 * specification keeps it in at any price, the price below which more of it is used); a ring marks
 * today's price. The sweep arrives per kg and per tonne; only the axes are converted.
 */
export function PriceSweepChart({ data, units }: { data: FormulaPriceSweep; units: Units }) {
  const [width, setWidth] = useState(0);
  const currency = units.currency;
  const points = data.sweep.points.filter((p) => p.costPerBatch !== null).map((p) => ({ ...p, pricePerKg: units.priceOf(p.pricePerKg) }));
  const per = 1000 / data.batchKg;
  const costs = points.map((p) => units.costOf(p.costPerBatch! * per));
  const pMin = units.priceOf(data.sweep.points[0]?.pricePerKg ?? 0);
  const pMax = units.priceOf(data.sweep.points[data.sweep.points.length - 1]?.pricePerKg ?? 1);
  const cLo = Math.min(...costs);
  const cHi = Math.max(...costs);
  const cPad = (cHi - cLo) * 0.1 || Math.max(1, cHi * 0.02);
  const yLo = cLo - cPad;
  const yHi = cHi + cPad;
  const incMax = Math.max(1, ...points.map((p) => p.percent ?? 0)) * 1.1;
  const plotW = Math.max(10, width - PAD.left - PAD.right);
  const plotH = HEIGHT - PAD.top - PAD.bottom;
  const x = (price: number) => PAD.left + ((price - pMin) / (pMax - pMin || 1)) * plotW;
  const yCost = (c: number) => PAD.top + (1 - (c - yLo) / (yHi - yLo || 1)) * plotH;
  const yInc = (pct: number) => PAD.top + (1 - pct / incMax) * plotH;
  const barW = Math.max(2, (plotW / Math.max(1, data.sweep.points.length)) * 0.6);
  const entry = data.sweep.entry;
  const enters = entry.kind === 'enters_in_range' ? units.priceOf(entry.price) : entry.kind === 'always_in' && entry.risesAbovePrice !== null ? units.priceOf(entry.risesAbovePrice) : null;
  const entersWords = entry.kind === 'always_in' ? 'more below' : 'enters at';
  const today = units.priceOf(data.currentPricePerKg);

  return (
    <View style={styles.wrap} onLayout={(e) => setWidth(e.nativeEvent.layout.width)} testID="price-sweep-chart" accessibilityLabel={`Cost per ${units.tonneWord} against the price per ${units.mass} of ${data.ingredientName}`}>
      {width > 0 && points.length > 1 ? (
        <Svg width={width} height={HEIGHT}>
          {ticks(yLo, yHi).map((t) => (
            <G key={`c${t}`}>
              <Line x1={PAD.left} x2={PAD.left + plotW} y1={yCost(t)} y2={yCost(t)} stroke={colors.rule} strokeWidth={1} />
              <SvgText x={PAD.left - 6} y={yCost(t) + 4} fontSize={11} fontFamily={fonts.figures} fill={colors.inkMuted} textAnchor="end">{t.toFixed(0)}</SvgText>
            </G>
          ))}
          {ticks(0, incMax).map((t) => (
            <SvgText key={`i${t}`} x={PAD.left + plotW + 6} y={yInc(t) + 4} fontSize={11} fontFamily={fonts.figures} fill={colors.accent}>{t.toFixed(0)}</SvgText>
          ))}
          {ticks(pMin, pMax).map((t) => (
            <SvgText key={`p${t}`} x={x(t)} y={HEIGHT - PAD.bottom + 16} fontSize={11} fontFamily={fonts.figures} fill={colors.inkMuted} textAnchor="middle">{t.toFixed(2)}</SvgText>
          ))}
          {points.map((p) => (
            <Rect key={`b${p.pricePerKg}`} x={x(p.pricePerKg) - barW / 2} y={yInc(p.percent ?? 0)} width={barW} height={Math.max(0, PAD.top + plotH - yInc(p.percent ?? 0))} fill={colors.accentSoft} stroke={colors.accent} strokeWidth={0.5} />
          ))}
          <Polyline points={points.map((p, i) => `${x(p.pricePerKg)},${yCost(costs[i])}`).join(' ')} fill="none" stroke={colors.brand} strokeWidth={2.5} />
          {enters !== null && enters >= pMin && enters <= pMax ? (
            <G testID="sweep-enters-marker">
              <Line x1={x(enters)} x2={x(enters)} y1={PAD.top} y2={PAD.top + plotH} stroke={colors.accent} strokeWidth={2} strokeDasharray="5,4" />
              <SvgText x={Math.min(x(enters) + 4, PAD.left + plotW - 90)} y={PAD.top + 12} fontSize={11} fill={colors.accent} fontFamily={fonts.text}>{`${entersWords} ${enters.toFixed(3)}/${units.mass}`}</SvgText>
            </G>
          ) : null}
          {today >= pMin && today <= pMax ? (
            <Circle cx={x(today)} cy={PAD.top + plotH} r={6} fill="none" stroke={colors.ink} strokeWidth={2} />
          ) : null}
          <Line x1={PAD.left} x2={PAD.left + plotW} y1={PAD.top + plotH} y2={PAD.top + plotH} stroke={colors.inkMuted} strokeWidth={1} />
          <SvgText x={PAD.left + plotW / 2} y={HEIGHT - 6} fontSize={12} fill={colors.inkMuted} textAnchor="middle" fontFamily={fonts.text}>{`its price, ${currency} per ${units.mass} as fed`}</SvgText>
        </Svg>
      ) : null}
      <View style={styles.axes}>
        <AppText variant="caption" style={{ color: colors.brand }}>Line: cost, {currency} per {units.tonneWord} of feed (left)</AppText>
        <AppText variant="caption" style={{ color: colors.accent }}>Bars: inclusion, % of the batch (right)</AppText>
        <AppText variant="caption" muted>Ring: today’s price</AppText>
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { width: '100%', gap: space.xs },
  axes: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
});
