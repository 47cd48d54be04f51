import { Link } from 'expo-router';

import { Screen } from '@/components/screen';
import { AppText } from '@/components/ui/text';

/** A link to a library or requirements page that cannot exist (the address is not a valid id). */
export function NotFoundScreen({ what }: { what: 'ingredient' | 'specification' }) {
  return (
    <Screen title={`No such ${what}`} testID="screen-not-found">
      <AppText>This address does not name a{what === 'ingredient' ? 'n' : ''} {what}.</AppText>
      <Link href={what === 'ingredient' ? '/library' : '/requirements'}>
        <AppText>Back to the {what === 'ingredient' ? 'library' : 'requirements'}</AppText>
      </Link>
    </Screen>
  );
}
