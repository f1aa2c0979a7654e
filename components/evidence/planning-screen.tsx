import { line } from 'd3-shape';
import { useEffect, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Line, Path } from 'react-native-svg';
import { FLAKE_MATERIAL_IDS, FLAKE_MATERIALS, MULTILAYER_MODEL, type FlakeMaterialId } from '@/shared/optics/materials';
import { space, useTheme } from '@/components/theme';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { DetailRow } from '@/components/ui/detail-row';
import { Screen } from '@/components/ui/screen';
import { LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { ContrastHeatMap } from './contrast-heat-map';
import { DatasetList } from './dataset-list';
import { paddedDomain, Plot } from './plot';
import {
  contrastPlan,
  describeContrast,
  GREEN_FILTER_NM,
  type ContrastPlan,
  type OxidePlan,
  type PlanningSubstrateKind,
  type TransparentPlan,
} from './planning-values';

const MATERIAL_CHOICES = FLAKE_MATERIAL_IDS.map((value) => ({ value, label: FLAKE_MATERIALS[value].displayName }));
const SUBSTRATE_CHOICES: { value: PlanningSubstrateKind; label: string }[] = [
  { value: 'oxide-on-silicon', label: 'Si with SiO₂' },
  { value: 'sapphire', label: 'Sapphire' },
  { value: 'quartz', label: 'Quartz' },
];

/**
 * The prediction is computed on the device (a few thousand thin-film evaluations). It runs after
 * the choice is drawn, so a slow phone shows "Computing…" rather than a frozen tap.
 */
function usePlan(material: FlakeMaterialId, kind: PlanningSubstrateKind): ContrastPlan | null {
  const [plan, setPlan] = useState<ContrastPlan | null>(null);
  useEffect(() => {
    setPlan(null);
    const timer = setTimeout(() => setPlan(contrastPlan(material, kind)), 0);
    return () => clearTimeout(timer);
  }, [material, kind]);
  return plan;
}

export function PlanningScreen() {
  const [material, setMaterial] = useState<FlakeMaterialId>('MoS2');
  const [kind, setKind] = useState<PlanningSubstrateKind>('oxide-on-silicon');
  const plan = usePlan(material, kind);

  return (
    <Screen
      title="Contrast planning"
      lead="Which substrate makes a monolayer easiest to find under the microscope."
      testID="planning-screen"
    >
      <Card>
        <ChoiceChips
          label="Material"
          choices={MATERIAL_CHOICES}
          value={material}
          onChange={setMaterial}
          testID="planning-material"
        />
        <ChoiceChips label="Substrate" choices={SUBSTRATE_CHOICES} value={kind} onChange={setKind} testID="planning-substrate" />
      </Card>
      {plan === null ? (
        <LoadingState label="Computing the predicted contrast…" />
      ) : plan.kind === 'oxide-on-silicon' ? (
        <OxidePlanCard plan={plan} material={material} />
      ) : (
        <TransparentPlanCard plan={plan} material={material} />
      )}
      {plan ? (
        <Card title="Optical constants used" testID="planning-datasets">
          <DatasetList datasets={plan.datasets} />
          <Text variant="caption" tone="muted">
            {`${MULTILAYER_MODEL} Layer thickness: ${FLAKE_MATERIALS[material].layerThicknessSource}`}
          </Text>
        </Card>
      ) : null}
    </Screen>
  );
}

function OxidePlanCard({ plan, material }: { plan: OxidePlan; material: FlakeMaterialId }) {
  const name = FLAKE_MATERIALS[material].displayName;
  return (
    <Card title={`Monolayer ${name} on SiO₂/Si`} lead="Predicted contrast at normal incidence." testID="planning-oxide">
      <View style={styles.readout}>
        <DetailRow label="Best oxide for white light (dashed line)" testID="planning-best-white">
          <Text variant="heading">{`${plan.whiteLight.oxideThicknessNm} nm`}</Text>
          <Text variant="caption" tone="muted">
            {describeContrast(plan.whiteLight.contrast)}
          </Text>
        </DetailRow>
        <DetailRow label={`Best oxide with a ${GREEN_FILTER_NM} nm filter (circle)`} testID="planning-best-green">
          <Text variant="heading">{`${plan.green.oxideThicknessNm} nm`}</Text>
          <Text variant="caption" tone="muted">
            {describeContrast(plan.green.contrast)}
          </Text>
        </DetailRow>
      </View>
      <ContrastHeatMap
        map={plan.map}
        marks={[
          { oxideThicknessNm: plan.whiteLight.oxideThicknessNm, label: 'white' },
          { oxideThicknessNm: plan.green.oxideThicknessNm, wavelengthNm: GREEN_FILTER_NM, label: 'green' },
        ]}
      />
      <Text variant="caption" tone="muted">
        White light is taken as flat from 400 to 700 nm. Common oxides are 90 and 285–300 nm; a thickness within a few nanometres
        of the best one is just as good.
      </Text>
    </Card>
  );
}

function TransparentPlanCard({ plan, material }: { plan: TransparentPlan; material: FlakeMaterialId }) {
  const { colors } = useTheme();
  const name = FLAKE_MATERIALS[material].displayName;
  const substrate = plan.kind === 'sapphire' ? 'sapphire' : 'quartz';
  const values = plan.spectrum.map((point) => point.contrast);
  const yDomain = paddedDomain([0, ...values]);
  return (
    <Card
      title={`Monolayer ${name} on ${substrate}`}
      lead="A transparent substrate has no oxide to tune; only the wavelength matters."
      testID="planning-transparent"
    >
      <View style={styles.readout}>
        <DetailRow label="White light" testID="planning-best-white">
          <Text variant="heading">{describeContrast(plan.whiteLightContrast)}</Text>
        </DetailRow>
        <DetailRow label="Strongest at" testID="planning-best-wavelength">
          <Text variant="heading">{`${plan.best.wavelengthNm} nm`}</Text>
          <Text variant="caption" tone="muted">
            {describeContrast(plan.best.contrast)}
          </Text>
        </DetailRow>
      </View>
      <Plot
        x={{
          domain: [plan.spectrum[0].wavelengthNm, plan.spectrum[plan.spectrum.length - 1].wavelengthNm],
          label: 'Wavelength (nm)',
        }}
        y={{ domain: yDomain, label: 'Contrast (%)', format: (value) => (value * 100).toFixed(0) }}
        accessibilityLabel={`Predicted monolayer contrast on ${substrate} against wavelength`}
        testID="planning-spectrum"
      >
        {({ x, y, innerWidth }) => (
          <>
            <Line x1={0} x2={innerWidth} y1={y(0)} y2={y(0)} stroke={colors.outline} strokeWidth={1} strokeDasharray="4 4" />
            <Path
              d={
                line<{ wavelengthNm: number; contrast: number }>()
                  .x((point) => x(point.wavelengthNm))
                  .y((point) => y(point.contrast))(plan.spectrum) ?? ''
              }
              stroke={colors.primary}
              strokeWidth={2.5}
              fill="none"
            />
          </>
        )}
      </Plot>
      <Text variant="caption" tone="muted">
        Light reflected from the back of the wafer is left out, as when the microscope focuses on the top surface.
      </Text>
    </Card>
  );
}

const styles = StyleSheet.create({
  readout: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xxl, rowGap: space.md },
});
