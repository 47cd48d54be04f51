import { Linking, StyleSheet, View } from 'react-native';
import { useQuery } from '@tanstack/react-query';

import { apiClient } from '@/api/client';
import { STALE } from '@/api/stale';
import { ErrorState } from '@/components/error-state';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { AppText } from '@/components/ui/text';
import { colors } from '@/theme';

type ReceivedMail = { id: number; to: string[]; from: string; subject: string; text: string; attachments: { filename: string }[]; receivedAt: string };

const URL_PATTERN = /(https?:\/\/\S+)/g;

/** Developer-only: the mail the local fake SMTP server received (invitations, reset links, shared results). */
export function DevMailScreen() {
  const mail = useQuery({ queryKey: ['dev-mail'], queryFn: ({ signal }) => apiClient.get<ReceivedMail[]>('/api/dev/mail', signal), staleTime: STALE.SECONDS.FIFTEEN });
  return (
    <Screen title="Development inbox" lead="Mail sent by this server in development. It never leaves this machine." testID="screen-dev-mail">
      <Button label="Refresh" tone="quiet" onPress={() => mail.refetch()} />
      {mail.isError ? <ErrorState error={mail.error} onRetry={() => mail.refetch()} /> : null}
      {mail.data?.length === 0 ? <AppText muted>Nothing received yet.</AppText> : null}
      {mail.data?.map((message) => (
        <Card key={message.id} title={message.subject} testID={`dev-mail-${message.id}`}>
          <AppText variant="small" muted>To {message.to.join(', ')} · {new Date(message.receivedAt).toLocaleString()}</AppText>
          <View>
            {message.text.split('\n').map((line, index) => (
              <AppText key={index}>
                {line.split(URL_PATTERN).map((part, i) =>
                  i % 2 === 1 ? (
                    <AppText key={i} style={styles.link} onPress={() => Linking.openURL(part)}>{part}</AppText>
                  ) : (
                    part
                  ),
                )}
              </AppText>
            ))}
          </View>
          {message.attachments.length ? <AppText variant="small" muted>Attached: {message.attachments.map((a) => a.filename).join(', ')}</AppText> : null}
        </Card>
      ))}
    </Screen>
  );
}

const styles = StyleSheet.create({ link: { color: colors.brand, textDecorationLine: 'underline' } });
