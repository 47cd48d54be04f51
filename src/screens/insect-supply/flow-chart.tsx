import { View } from 'react-native';
import Svg, { G, Line, Polygon, Rect, Text as SvgText } from 'react-native-svg';

import { useUnits } from '@/lib/measures-format';
import type { SupplyPlanResult } from '@/shared/supply/plan';
import { SUBSTRATES } from '@/shared/supply/substrates';
import { colors, fonts } from '@/theme';

import { massText } from './format';

const W = 360;
const BOX_H = 44;

function Box({ x, y, w, title, value, tone, testID }: { x: number; y: number; w: number; title: string; value: string; tone: 'stream' | 'larvae' | 'meal' | 'frass' | 'oil'; testID?: string }) {
  const fill = { stream: colors.paperSunken, larvae: colors.accentSoft, meal: colors.brandSoft, frass: colors.paperSunken, oil: colors.cautionSoft }[tone];
  const stroke = tone === 'meal' ? colors.brand : tone === 'larvae' ? colors.accent : colors.rule;
  return (
    <G testID={testID}>
      <Rect x={x} y={y} width={w} height={BOX_H} rx={6} fill={fill} stroke={stroke} strokeWidth={1.2} />
      <SvgText x={x + 8} y={y + 17} fontSize={11} fontFamily={fonts.textSemiBold} fill={colors.ink}>{title}</SvgText>
      <SvgText x={x + 8} y={y + 34} fontSize={12} fontFamily={fonts.figures} fill={colors.ink}>{value}</SvgText>
    </G>
  );
}

function Arrow({ x1, y1, x2, y2, label }: { x1: number; y1: number; x2: number; y2: number; label?: string }) {
  const angle = Math.atan2(y2 - y1, x2 - x1);
  const head = (a: number) => `${x2 - 7 * Math.cos(angle - a)},${y2 - 7 * Math.sin(angle - a)}`;
  return (
    <G>
      <Line x1={x1} y1={y1} x2={x2} y2={y2} stroke={colors.inkMuted} strokeWidth={1.4} />
      <Polygon points={`${x2},${y2} ${head(0.45)} ${head(-0.45)}`} fill={colors.inkMuted} />
      {label ? <SvgText x={(x1 + x2) / 2 + 6} y={(y1 + y2) / 2 + 4} fontSize={10} fontFamily={fonts.text} fill={colors.inkMuted}>{label}</SvgText> : null}
    </G>
  );
}

/**
 * The week's masses as a flow: each by-product stream → rearing → fresh larvae and frass → dried meal
 * (and oil when pressed). Every box carries its mass and unit.
 */
export function SupplyFlowChart({ plan }: { plan: SupplyPlanResult }) {
  const streams = plan.streams;
  const streamsH = Math.max(1, streams.length) * (BOX_H + 8);
  const yRear = streamsH + 28;
  const yOut = yRear + BOX_H + 36;
  const yMeal = yOut + BOX_H + 44;
  const H = yMeal + BOX_H + 8;
  const t = plan.totals;
  const p = plan.processing;
  const half = (W - 12) / 2;
  const units = useUnits();
  return (
    <View testID="supply-flow-chart" accessibilityLabel={`Flow of masses per week: ${streams.length} streams, ${massText(units, t.substrateFreshKg)} of substrate, ${massText(units, t.larvaeFreshKg)} of fresh larvae, ${massText(units, p.mealKg)} of meal, ${massText(units, t.residueAsTakenOffKg)} of frass`}>
      <Svg width="100%" height={undefined} viewBox={`0 0 ${W} ${H}`} style={{ aspectRatio: W / H, maxWidth: 640 }}>
        {streams.map((s, i) => (
          <Box key={i} x={0} y={i * (BOX_H + 8)} w={W} title={`${s.name || SUBSTRATES[s.substrate].label} (${Math.round(s.factors.moisturePct)} % water)`} value={massText(units, s.fed.freshKg)} tone="stream" testID={`flow-stream-${i}`} />
        ))}
        <Arrow x1={W / 2} y1={streamsH - 6} x2={W / 2} y2={yRear - 2} />
        <Box x={0} y={yRear} w={W} title="Rearing: dry matter fed" value={`${massText(units, t.substrateDryMatterKg)} DM · respired ${massText(units, t.respiredDryMatterKg)} DM`} tone="stream" />
        <Arrow x1={half / 2} y1={yRear + BOX_H} x2={half / 2} y2={yOut - 2} />
        <Arrow x1={half + 12 + half / 2} y1={yRear + BOX_H} x2={half + 12 + half / 2} y2={yOut - 2} />
        <Box x={0} y={yOut} w={half} title="Fresh larvae" value={massText(units, t.larvaeFreshKg)} tone="larvae" testID="flow-larvae" />
        <Box x={half + 12} y={yOut} w={half} title={`Frass (${massText(units, t.residueDryMatterKg)} DM)`} value={massText(units, t.residueAsTakenOffKg)} tone="frass" testID="flow-frass" />
        <Arrow x1={half / 2} y1={yOut + BOX_H} x2={half / 2} y2={yMeal - 2} label={`drying −${massText(units, p.dryingWaterKg)} water`} />
        {p.defatted ? (
          <>
            <Box x={0} y={yMeal} w={half} title="Pressed meal" value={massText(units, p.mealKg)} tone="meal" testID="flow-meal" />
            <Arrow x1={half} y1={yMeal - 22} x2={half + 40} y2={yMeal} />
            <Box x={half + 12} y={yMeal} w={half} title="Larvae oil" value={massText(units, p.oilKg)} tone="oil" testID="flow-oil" />
          </>
        ) : (
          <Box x={0} y={yMeal} w={half} title="Dried meal" value={massText(units, p.mealKg)} tone="meal" testID="flow-meal" />
        )}
      </Svg>
    </View>
  );
}
