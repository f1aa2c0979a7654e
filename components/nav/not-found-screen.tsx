import { Link } from 'expo-router';
import { Wordmark } from '@/components/brand/wordmark';
import { Button } from '@/components/ui/button';
import { Screen } from '@/components/ui/screen';
import { Text } from '@/components/ui/text';
import { LAB_HOME } from '@/hooks/use-next-path';

export function NotFoundScreen() {
  return (
    <Screen title="Nothing on this shelf" width="narrow" centered above={<Wordmark size="large" />} testID="not-found-screen">
      <Text tone="muted">This address does not lead to anything in Flakeline. It may be mistyped, or the page has moved.</Text>
      <Link href={LAB_HOME} asChild>
        <Button title="Go to Flakeline" icon="home-outline" testID="not-found-home" />
      </Link>
    </Screen>
  );
}
