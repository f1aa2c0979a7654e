import { Link, Redirect } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { LoadingState } from '@/components/ui/state-views';
import { useSessionQuery } from '@/hooks/use-session';
import { readCode, recordPath } from './read-code';

/**
 * Where a label's QR code leads (`/s/<code>`): straight on to the sample or box. The lab area's
 * guard has already sent anyone signed out to sign in and back here; until the session is known
 * nothing is redirected, so that round trip returns to this address.
 */
export function ResolveCodeScreen({ code }: { code: string }) {
  const session = useSessionQuery();
  const read = readCode(code);

  if (!session.data) {
    return (
      <Screen title="Opening a label" testID="resolve-screen">
        <LoadingState label="Checking who is signed in…" />
      </Screen>
    );
  }

  if (read.kind === 'sample' || read.kind === 'box') return <Redirect href={recordPath(read)} />;

  const scanAgain = (
    <Link href="/scan" asChild>
      <Button title="Scan or type the code" icon="scan-outline" testID="resolve-scan" />
    </Link>
  );

  return (
    <Screen title={read.kind === 'typo' ? 'This code has a typo' : 'Not a Flakeline code'} testID="resolve-screen">
      <View style={styles.body}>
        {read.kind === 'typo' ? (
          <Notice tone="warn" title={`“${read.text}” does not check out`} action={scanAgain} testID="resolve-typo">
            {`${read.message} Its last symbol is a check on the others, so one of them was misread or mistyped. Compare it with the label.`}
          </Notice>
        ) : (
          <Notice tone="warn" title="This link does not name a Flakeline record" action={scanAgain} testID="resolve-foreign">
            {`“${code}” is not a sample or box code. Codes look like CH-4F7K2M followed by a check symbol.`}
          </Notice>
        )}
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  body: { gap: space.lg },
});
