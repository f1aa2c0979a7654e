import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import type { Sample } from '@/shared/schemas/sample';
import { LensDesignCard } from '@/components/devices/lens-design-card';
import { MeasurementsCard } from '@/components/devices/measurements-card';
import { canWriteSamples } from '@/components/samples/writers-only';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { useSessionQuery } from '@/hooks/use-session';

/**
 * The parts of a record page about devices and publication: a device's lens design and
 * measurements, and for every record the ways to its lineage picture and its audit.
 */
export function RecordProvenanceSection({ sample }: { sample: Sample }) {
  const session = useSessionQuery();
  const canWrite = canWriteSamples(session.data) && sample.status !== 'retired';
  return (
    <>
      {sample.kind === 'device' ? (
        <>
          <LensDesignCard code={sample.code} />
          <MeasurementsCard code={sample.code} canWrite={canWrite} />
        </>
      ) : null}
      <Card
        title="Provenance"
        lead="Everything this record came from as a picture, and the audit that checks it for a paper."
        testID="record-provenance"
      >
        <View style={styles.actions}>
          <Link href={{ pathname: '/samples/[code]/lineage', params: { code: sample.code } }} asChild>
            <Button title="Lineage picture" icon="git-network-outline" variant="secondary" testID="record-lineage-picture" />
          </Link>
          <Link href={{ pathname: '/samples/[code]/audit', params: { code: sample.code } }} asChild>
            <Button title="Audit" icon="shield-checkmark-outline" variant="secondary" testID="record-audit" />
          </Link>
        </View>
      </Card>
    </>
  );
}

const styles = StyleSheet.create({
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
