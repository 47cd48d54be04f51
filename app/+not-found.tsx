import { Link, Stack } from 'expo-router';

import { Screen } from '@/components/screen';
import { AppText } from '@/components/ui/text';
import { colors } from '@/theme';

export default function NotFoundRoute() {
  return (
    <>
      <Stack.Screen options={{ title: 'Not found' }} />
      <Screen title="Page not found" lead="There is nothing at this address.">
        <Link href="/" style={{ color: colors.brand }}>
          <AppText style={{ color: colors.brand }}>Go to Formulas</AppText>
        </Link>
      </Screen>
    </>
  );
}
