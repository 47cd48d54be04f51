import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { useLocalSearchParams, useRouter } from 'expo-router';

import { useInvitationAcceptMutation, useInvitationPreviewQuery, useSessionQuery } from '@/api/session';
import { AuthFrame } from '@/components/auth/auth-frame';
import { describeError } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { AppText } from '@/components/ui/text';
import { ROLE_DESCRIPTIONS, ROLE_LABELS } from '@/shared/permissions';
import { space } from '@/theme';

/** Where an invitation link lands: says who invites whom as what, then sign in, sign up or accept. */
export function InvitationScreen() {
  const router = useRouter();
  const { token } = useLocalSearchParams<{ token?: string }>();
  const preview = useInvitationPreviewQuery(token);
  const session = useSessionQuery();
  const accept = useInvitationAcceptMutation();
  const [error, setError] = useState<string | null>(null);

  if (!token || preview.isError) {
    return (
      <AuthFrame title="Invitation" testID="screen-invitation">
        <FormMessage tone="danger" text={token ? describeError(preview.error) : 'This page needs the link from the invitation e-mail.'} />
      </AuthFrame>
    );
  }
  if (!preview.data || session.isPending) return <AuthFrame title="Invitation" testID="screen-invitation"><AppText muted>Reading the invitation…</AppText></AuthFrame>;

  const { organizationName, role, email, accountExists } = preview.data;
  const signedInAs = session.data?.user.email;
  return (
    <AuthFrame title={`Join ${organizationName}`} lead={`As ${ROLE_LABELS[role].toLowerCase()}: ${ROLE_DESCRIPTIONS[role]}`} testID="screen-invitation">
      <AppText>The invitation is for {email}.</AppText>
      <View style={styles.actions}>
        {signedInAs === email ? (
          <Button
            label={accept.isPending ? 'Joining…' : `Join ${organizationName}`}
            disabled={accept.isPending}
            testID="invitation-accept"
            onPress={async () => {
              setError(null);
              try {
                await accept.mutateAsync(token);
                router.replace('/account');
              } catch (e) {
                setError(describeError(e));
              }
            }}
          />
        ) : signedInAs ? (
          <FormMessage tone="danger" text={`You are signed in as ${signedInAs}. Sign out, then open the link again to join as ${email}.`} />
        ) : accountExists ? (
          <Button label="Sign in to join" onPress={() => router.push(`/sign-in?next=${encodeURIComponent(`/invitation?token=${token}`)}`)} testID="invitation-sign-in" />
        ) : (
          <Button label="Create your account" onPress={() => router.push(`/sign-up?invitation=${encodeURIComponent(token)}`)} testID="invitation-sign-up" />
        )}
        <FormMessage tone="danger" text={error} />
      </View>
    </AuthFrame>
  );
}

const styles = StyleSheet.create({ actions: { gap: space.md } });
