import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { useShareCreateMutation, useShareTargetsQuery } from '@/api/shares';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import type { RationCheckInput } from '@/shared/schemas/ration-checks';
import { space } from '@/theme';

export type ShareWhat = { kind: 'ration_check'; check: RationCheckInput } | { kind: 'formula_version'; formulaId: number; versionId: number };

/** Share a result with one of the farms the user belongs to: its members get an e-mail with a link and the CSV. */
export function ShareCard({ what }: { what: ShareWhat }) {
  const targets = useShareTargetsQuery();
  const share = useShareCreateMutation();
  const [farm, setFarm] = useState<string>('');
  const [note, setNote] = useState('');
  const chosen = farm || String(targets.data?.[0]?.id ?? '');
  if (targets.data && targets.data.length === 0) {
    return (
      <Card title="Share with a farm" testID="share-card">
        <AppText muted>You are not a member of any farm yet. A farm’s owner can invite you as an advisor; then you can share results with it.</AppText>
      </Card>
    );
  }
  return (
    <Card title="Share with a farm" testID="share-card">
      {targets.data ? <ChoiceChips label="Farm" options={targets.data.map((t) => ({ value: String(t.id), label: t.name }))} value={chosen} onChange={setFarm} testID="share-farm" /> : null}
      <TextField label="Note for the farm" hint="optional" multiline value={note} onChangeText={setNote} testID="share-note" />
      <FormMessage tone="danger" text={share.error?.message} testID="share-error" />
      <FormMessage tone="ok" text={share.data ? `Sent to ${share.data.recipients.join(', ')}. They can open it after signing in.` : null} testID="share-done" />
      <View style={styles.actions}>
        <Button
          label={share.isPending ? 'Sending…' : 'Share by e-mail'}
          disabled={share.isPending || !chosen}
          onPress={() => share.mutate({ ...what, toOrganizationId: Number(chosen), note: note.trim() || null })}
          testID="share-submit"
        />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({ actions: { flexDirection: 'row', gap: space.md } });
