import { Pressable, StyleSheet, View } from 'react-native';
import { useRouter } from 'expo-router';

import { useReceivedSharesQuery } from '@/api/shares';
import { ErrorState } from '@/components/error-state';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { AppText } from '@/components/ui/text';
import { colors, radius, space, TOUCH_MIN } from '@/theme';

import { when } from './format';

/** The Formulas section for a farm member: check a ration, and read what advisors shared with the farm. */
export function FarmHome() {
  const router = useRouter();
  const shares = useReceivedSharesQuery();
  return (
    <Screen title="Rations" lead="Check what you mix, and read the results your advisor shared." testID="screen-formulas">
      <Card title="Check my ration">
        <AppText>Enter what you mix, in kg, and see what is short, what is in excess and what it costs.</AppText>
        <Button label="Check a ration" onPress={() => router.push('/ration-check')} testID="open-ration-check" />
      </Card>
      <Card title="Shared with your farm" testID="received-shares">
        {shares.isPending ? <AppText muted>Loading…</AppText> : null}
        {shares.isError ? <ErrorState error={shares.error} onRetry={() => shares.refetch()} /> : null}
        {shares.data?.length === 0 ? <AppText muted>Nothing has been shared with your farm yet.</AppText> : null}
        {shares.data?.map((s) => (
          <Pressable key={s.token} role="link" onPress={() => router.push(`/shared/${s.token}`)} style={styles.row} testID={`received-share-${s.token}`}>
            <View style={styles.rowText}>
              <AppText variant="label">{s.title}</AppText>
              <AppText variant="small" muted>From {s.sharedBy}, {s.fromOrganization} · {when(s.sharedAt)}</AppText>
              {s.note ? <AppText variant="small">{s.note}</AppText> : null}
            </View>
          </Pressable>
        ))}
      </Card>
    </Screen>
  );
}

const styles = StyleSheet.create({
  row: { minHeight: TOUCH_MIN, padding: space.md, borderRadius: radius.md, borderWidth: 1, borderColor: colors.rule },
  rowText: { gap: 2 },
});
