import { Link } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { formatLengthUm, formatNumber } from '@/shared/zone-plate';
import { SectionStatus } from '@/components/samples/section-status';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { DetailRow } from '@/components/ui/detail-row';
import { formatDateTime } from '@/components/ui/format';
import { Notice } from '@/components/ui/notice';
import { Text } from '@/components/ui/text';
import { useLensDesignQuery } from '@/hooks/use-devices';
import { formatFineLength } from './lens-figures';

/** A device's current lens design in brief, with the way into the designer. */
export function LensDesignCard({ code }: { code: string }) {
  const query = useLensDesignQuery(code);
  const design = query.data?.design ?? null;
  return (
    <Card title="Lens design" lead="The zone-plate lens patterned into this device." testID="device-lens-design">
      {!query.data ? (
        <SectionStatus query={query} what="the lens design" />
      ) : design ? (
        <>
          <View style={styles.facts}>
            <DetailRow
              label="Design wavelength"
              testID="lens-card-wavelength"
            >{`${formatNumber(design.input.wavelengthNm)} nm`}</DetailRow>
            <DetailRow label="Focal length" testID="lens-card-focal">
              {formatLengthUm(design.input.focalLengthUm)}
            </DetailRow>
            <DetailRow label="Zones">{String(design.summary.zoneCount)}</DetailRow>
            <DetailRow label="Diameter">{formatLengthUm(design.summary.lensDiameterUm)}</DetailRow>
            <DetailRow label="Outermost zone">{formatFineLength(design.summary.outermostZoneWidthUm)}</DetailRow>
            <DetailRow label="NA">{formatNumber(design.summary.numericalAperture)}</DetailRow>
          </View>
          {design.warnings.map((warning) => (
            <Notice key={warning.code} tone="warn">
              {warning.message}
            </Notice>
          ))}
          <Text variant="caption" tone="muted">
            {`Saved by ${design.createdBy.displayName} on ${formatDateTime(design.createdAt)}.`}
          </Text>
        </>
      ) : (
        <Text tone="muted" testID="lens-card-none">
          No lens designed yet.
        </Text>
      )}
      <Link href={{ pathname: '/samples/[code]/lens', params: { code } }} asChild>
        <Button
          title={design ? 'Open the lens designer' : 'Design the lens'}
          icon="aperture-outline"
          variant="secondary"
          testID="device-design-lens"
        />
      </Link>
    </Card>
  );
}

const styles = StyleSheet.create({
  facts: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xl, rowGap: space.md },
});
