import { StyleSheet, View } from 'react-native';

import { CautionBanner } from '@/components/caution-banner';
import { Card } from '@/components/ui/card';
import { AppText, Figure } from '@/components/ui/text';
import type { Finding } from '@/shared/ration-check';
import type { RationCheckResponse } from '@/shared/schemas/ration-checks';
import { formatLevel as level, massFromKg, massUnit } from '@/shared/measures';
import { colors, radius, space } from '@/theme';

const KIND_LABEL: Record<Finding['kind'], string> = { short: 'Short', excess: 'Too high', refused: 'Not allowed', unknown: 'No value', ok: 'OK' };
const KIND_ORDER: Finding['kind'][] = ['refused', 'short', 'excess', 'unknown', 'ok'];

/** A ration check's answer in plain words: summary, what is short or too high, and the cheapest fixes. */
export function RationCheckResults({ check }: { check: RationCheckResponse }) {
  const r = check.result;
  const system = check.measures.unitSystem;
  const unit = massUnit(system);
  const findings = [...r.findings].sort((a, b) => KIND_ORDER.indexOf(a.kind) - KIND_ORDER.indexOf(b.kind));
  return (
    <View style={styles.wrap} testID="ration-results">
      <CautionBanner />
      <Card title={r.meetsRequirement ? 'Your mix meets the requirement' : 'Your mix needs attention'} testID="ration-summary">
        {r.summary.map((s) => <AppText key={s}>{s}</AppText>)}
      </Card>
      <Card title="Nutrient by nutrient">
        {findings.map((f) => (
          <View key={`${f.kind}-${f.id}`} style={styles.finding} testID={`finding-${f.kind}`}>
            <View style={[styles.badge, badgeStyle(f.kind)]}>
              <AppText variant="caption" style={styles.badgeText}>{KIND_LABEL[f.kind]}</AppText>
            </View>
            <View style={styles.findingMain}>
              <AppText>{f.text}</AppText>
              {f.value !== null && f.unit ? <Figure value={level(f.value)} unit={f.unit} /> : null}
            </View>
          </View>
        ))}
      </Card>
      {r.corrections.map((c) => (
        <Card key={c.mode} title={c.mode === 'add' ? 'Cheapest fix: add to what you mix' : 'Cheapest fix: same amount, other proportions'} testID={`correction-${c.mode}`}>
          {c.text.map((t) => <AppText key={t}>{t}</AppText>)}
          {c.status === 'found'
            ? c.lines.map((l) => (
                <View key={l.key} style={styles.row}>
                  <AppText style={styles.rowName}>{l.name}</AppText>
                  <Figure value={level(massFromKg(l.newKg, system))} unit={unit} />
                  <AppText variant="small" muted>{l.changeKg >= 0 ? '+' : '−'}{level(massFromKg(Math.abs(l.changeKg), system))} {unit}</AppText>
                </View>
              ))
            : null}
        </Card>
      ))}
    </View>
  );
}

function badgeStyle(kind: Finding['kind']) {
  if (kind === 'ok') return { backgroundColor: colors.okSoft };
  if (kind === 'unknown') return { backgroundColor: colors.paperSunken };
  if (kind === 'excess') return { backgroundColor: colors.cautionSoft };
  return { backgroundColor: colors.dangerSoft };
}

const styles = StyleSheet.create({
  wrap: { gap: space.lg },
  finding: { flexDirection: 'row', gap: space.sm, alignItems: 'flex-start', paddingVertical: space.sm, borderBottomWidth: 1, borderBottomColor: colors.rule },
  badge: { paddingHorizontal: space.sm, paddingVertical: 2, borderRadius: radius.sm, minWidth: 76, alignItems: 'center' },
  badgeText: { fontWeight: '600', color: colors.ink },
  findingMain: { flex: 1, minWidth: 0, gap: 2 },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, alignItems: 'baseline', paddingVertical: space.xs },
  rowName: { flex: 1, minWidth: 140 },
});
