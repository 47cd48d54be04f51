import { Platform, ScrollView, StyleSheet, View } from 'react-native';
import { Link } from 'expo-router';

import { ApiError } from '@/api/client';
import { shareCsvUrl, useShareQuery } from '@/api/shares';
import { CautionBanner } from '@/components/caution-banner';
import { ErrorState } from '@/components/error-state';
import { Card } from '@/components/ui/card';
import { AppText, Figure } from '@/components/ui/text';
import { bulkUnit, costPerBulkUnit, formatLevel, formatMoney, massFromKg, massUnit, pricePerMassUnit } from '@/shared/measures';
import type { ShareDetail } from '@/shared/schemas/shares';
import { colors, space } from '@/theme';

import { RationCheckResults } from '../ration-check/results';
import { SignedInGate } from './signed-in-gate';

/** A result shared with a farm, read-only, in the farm's units and currency. */
export function SharedResultScreen({ token }: { token: string }) {
  return (
    <SignedInGate path={`/shared/${token}`}>
      <SharedBody token={token} />
    </SignedInGate>
  );
}

function SharedBody({ token }: { token: string }) {
  const share = useShareQuery(token);
  const d = share.data;
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content} testID="screen-shared-result">
      <View style={styles.column}>
        <Link href="/" style={styles.back}>← Troughline</Link>
        <AppText variant="display" accessibilityRole="header" style={styles.title}>{d ? d.title : 'Shared result'}</AppText>
        {share.isPending ? <AppText muted>Loading…</AppText> : null}
        {share.isError && share.error instanceof ApiError && share.error.status === 404 ? (
          <Card title="Not found" testID="shared-not-found">
            <AppText>This shared result does not exist, or it was shared with an organization you are not a member of. Sign in with the account of the farm it was sent to.</AppText>
          </Card>
        ) : share.isError ? (
          <ErrorState error={share.error} onRetry={() => share.refetch()} />
        ) : null}
        {d ? (
          <>
            <AppText variant="lead" testID="shared-from">Shared by {d.sharedBy} ({d.fromOrganization}) with {d.toOrganization} on {d.sharedAt.slice(0, 10)}.</AppText>
            {d.note ? <Card title="Note"><AppText>{d.note}</AppText></Card> : null}
            {Platform.OS === 'web' ? <a href={shareCsvUrl(token)} download data-testid="shared-csv" style={{ color: colors.brand }}>Download as CSV</a> : null}
            {d.payload.kind === 'ration_check' ? <RationCheckResults check={{ ...d.payload.check, measures: d.measures }} /> : <FormulaResult d={d} />}
          </>
        ) : null}
      </View>
    </ScrollView>
  );
}

function FormulaResult({ d }: { d: ShareDetail }) {
  if (d.payload.kind !== 'formula_version') return null;
  const { snapshot: s, version } = d.payload;
  const r = s.result;
  const system = d.measures.unitSystem;
  const unit = massUnit(system);
  const cur = d.measures.currency;
  return (
    <View style={styles.wrap} testID="shared-formula">
      <CautionBanner />
      <AppText>
        Version {version.number}{version.approvedAt ? `, approved by ${version.approvedBy} on ${version.approvedAt.slice(0, 10)}` : ', not approved'}
        {s.specification ? ` · against ${s.specification.name} (${s.specification.source})` : ''} · all amounts as fed.
      </AppText>
      {r.status !== 'optimal' ? (
        <Card title="No mix meets this specification"><AppText>{r.message}</AppText></Card>
      ) : (
        <>
          <Card title={`Mix for ${formatLevel(massFromKg(r.batchKg, system))} ${unit}`} testID="shared-mix">
            {r.mix.map((m) => (
              <View key={m.id} style={styles.row}>
                <AppText style={styles.name}>{m.name ?? m.id}</AppText>
                <Figure value={m.percent.toFixed(2)} unit="%" />
                <Figure value={formatLevel(massFromKg(m.kg, system))} unit={unit} />
                <AppText variant="small" muted>{formatMoney(pricePerMassUnit(m.pricePerKg, system), cur)} per {unit}</AppText>
              </View>
            ))}
            <AppText testID="shared-cost">Cost: {formatMoney(costPerBulkUnit(r.costPerTonne, system), cur, 2)} per {bulkUnit(system)}</AppText>
          </Card>
          <Card title="Nutrients of the mix">
            {r.nutrients.map((n) => (
              <View key={n.id} style={styles.row}>
                <AppText style={styles.name}>{n.name ?? n.id}</AppText>
                <Figure value={formatLevel(n.value)} unit={n.unit ?? ''} />
                <AppText variant="small" muted>{n.min != null ? `min ${formatLevel(n.min)}` : ''}{n.min != null && n.max != null ? ' · ' : ''}{n.max != null ? `max ${formatLevel(n.max)}` : ''}</AppText>
              </View>
            ))}
          </Card>
          {s.capWarnings.map((w) => <AppText key={w.label} style={styles.warn}>{w.message}</AppText>)}
        </>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.paper },
  content: { padding: space.md, paddingBottom: space.xxl },
  column: { width: '100%', maxWidth: 900, alignSelf: 'center', gap: space.lg },
  title: { color: colors.brand },
  back: { color: colors.brand, paddingVertical: space.sm },
  wrap: { gap: space.lg },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, alignItems: 'baseline', paddingVertical: space.xs, borderBottomWidth: 1, borderBottomColor: colors.rule },
  name: { flex: 1, minWidth: 160 },
  warn: { color: colors.caution },
});
