import { useDeferredValue, useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { LabSettings, LensDesignEnvelope } from '@/shared/schemas/device';
import type { ZonePlateDesignRequest } from '@/shared/schemas/zone-plate';
import { designZonePlate, formatLengthUm, formatNumber } from '@/shared/zone-plate';
import { BackToRecord } from '@/components/audit/back-to-record';
import { DownloadButton } from '@/components/audit/download-button';
import { canWriteSamples } from '@/components/samples/writers-only';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { formatDateTime } from '@/components/ui/format';
import { FormProblem } from '@/components/ui/form-problem';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { TextLink } from '@/components/ui/text-link';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { radiiCsvFileName, radiiCsvPath, useLensDesignQuery, useSaveLensDesignMutation } from '@/hooks/use-devices';
import { useLabSettingsQuery } from '@/hooks/use-lab-settings';
import { useSampleQuery } from '@/hooks/use-samples';
import { useSessionQuery } from '@/hooks/use-session';
import { LabLithographySetting } from './lab-lithography-setting';
import { LensDesignForm } from './lens-design-form';
import { LensDesignResults } from './lens-design-results';
import {
  DEFAULT_MIN_FEATURE_NM,
  EMPTY_LENS_FORM,
  lensFormFromInput,
  parseLensForm,
  type LensFormValues,
} from './lens-form-values';
import { RingPattern } from './ring-pattern';

const TITLE = 'Lens design';
const LEAD = 'A Fresnel zone-plate lens for this device: zone radii, what it will do, and the radii table for the lithography.';

/** The zone-plate designer of one device: inputs, live results, ring pattern, save and export. */
export function LensDesignerScreen({ code }: { code: string }) {
  const sample = useSampleQuery(code);
  const isDevice = sample.data?.kind === 'device';
  const design = useLensDesignQuery(code, { enabled: isDevice });
  const settings = useLabSettingsQuery();

  let body;
  if (!sample.data) {
    body = sample.isError ? (
      <ErrorState
        title={`Could not load ${code}`}
        error={sample.error}
        onRetry={() => void sample.refetch()}
        retrying={sample.isFetching}
      />
    ) : (
      <LoadingState label={`Loading ${code}…`} />
    );
  } else if (!isDevice) {
    body = (
      <EmptyState icon="aperture-outline" title="Only devices carry a lens design" testID="lens-not-device">
        {`${code} is not a device. A lens is designed on the device record that the lithography step made.`}
      </EmptyState>
    );
  } else if (!design.data || !settings.data) {
    const failed = design.isError ? design : settings.isError ? settings : null;
    body = failed ? (
      <ErrorState
        title="Could not load the lens design"
        error={failed.error}
        onRetry={() => void failed.refetch()}
        retrying={failed.isFetching}
      />
    ) : (
      <LoadingState label="Loading the lens design…" />
    );
  } else {
    body = <LensDesigner code={code} saved={design.data} settings={settings.data} />;
  }

  return (
    <Screen title={TITLE} lead={LEAD} above={<BackToRecord code={code} />} width="wide" testID="lens-designer-screen">
      {body}
    </Screen>
  );
}

/** True when the form holds exactly the saved design, so the server's radii table matches the screen. */
function sameAsSaved(input: ZonePlateDesignRequest, saved: LensDesignEnvelope['design']): boolean {
  if (!saved) return false;
  const stored = saved.input;
  return (
    input.wavelengthNm === stored.wavelengthNm &&
    input.focalLengthUm === stored.focalLengthUm &&
    (input.apertureDiameterUm ?? null) === stored.apertureDiameterUm &&
    (input.zoneCount ?? null) === stored.zoneCount &&
    input.etchedZones === stored.etchedZones
  );
}

interface LensDesignerProps {
  code: string;
  saved: LensDesignEnvelope;
  settings: LabSettings;
}

function LensDesigner({ code, saved, settings }: LensDesignerProps) {
  const minFeatureNm = settings.minFeatureNm || DEFAULT_MIN_FEATURE_NM;
  const session = useSessionQuery();
  const { isWide } = useBreakpoints();
  const canSave = canWriteSamples(session.data);
  const save = useSaveLensDesignMutation(code);
  const [values, setValues] = useState<LensFormValues>(() =>
    saved.design ? lensFormFromInput(saved.design.input) : EMPTY_LENS_FORM,
  );
  const [justSaved, setJustSaved] = useState(false);
  // Typing stays smooth for designs of many thousand zones: the results follow a moment later.
  const deferred = useDeferredValue(values);
  const parsed = useMemo(() => parseLensForm(deferred, minFeatureNm), [deferred, minFeatureNm]);
  const design = useMemo(() => (parsed.ok ? designZonePlate(parsed.input) : null), [parsed]);
  // Messages follow what is typed now, not the deferred copy.
  const shown = parseLensForm(values, minFeatureNm);
  const current = saved.design;
  const unchanged = shown.ok && sameAsSaved(shown.input, current);

  const change = (patch: Partial<LensFormValues>) => {
    setJustSaved(false);
    save.reset();
    setValues((before) => ({ ...before, ...patch }));
  };
  const submit = () => {
    if (!shown.ok) return;
    save.mutate(shown.input, { onSuccess: () => setJustSaved(true) });
  };

  const inputs = (
    <Card title="Design inputs" testID="lens-inputs">
      <LensDesignForm values={values} errors={shown.ok ? {} : shown.errors} onChange={change} editable />
      {!shown.ok && shown.formErrors.length > 0 ? (
        <Notice tone="error" title="This design is not possible">
          {shown.formErrors.join(' ')}
        </Notice>
      ) : null}
      <LabLithographySetting settings={settings} canEdit={session.data?.role === 'manager'} />
      <SaveAndExport
        code={code}
        canSave={canSave}
        valid={shown.ok}
        unchanged={unchanged}
        hasSaved={current !== null}
        saving={save.isPending}
        error={save.error}
        justSaved={justSaved && unchanged}
        warningCount={design?.warnings.length ?? 0}
        onSave={submit}
      />
      {current ? <SavedDesignFacts saved={saved} /> : null}
    </Card>
  );
  // Nothing typed yet (or results a moment behind the typing): invite, do not complain.
  const inviting = shown.ok || shown.blank;
  const results = design ? (
    <>
      <Card title="Ring pattern" lead="Seen from above, as the lithography writes it." testID="lens-pattern-card">
        <RingPattern design={design} />
      </Card>
      <Card title="What this lens does" testID="lens-results-card">
        <LensDesignResults design={design} />
      </Card>
    </>
  ) : (
    <Card testID="lens-results-empty">
      <EmptyState icon="aperture-outline" title={inviting ? 'Type a design' : 'Not a lens yet'}>
        {inviting
          ? 'Give the wavelength, the focal length and the aperture or number of zones; the zones, the figures and the ring pattern appear as you type.'
          : 'Fix the inputs marked in red; the results appear as soon as the design is possible.'}
      </EmptyState>
    </Card>
  );

  return isWide ? (
    <View style={styles.columns}>
      <View style={styles.left}>{inputs}</View>
      <View style={styles.right}>{results}</View>
    </View>
  ) : (
    <View style={styles.stack}>
      {inputs}
      {results}
    </View>
  );
}

interface SaveAndExportProps {
  code: string;
  canSave: boolean;
  valid: boolean;
  unchanged: boolean;
  hasSaved: boolean;
  saving: boolean;
  error: unknown;
  justSaved: boolean;
  /** Warnings of the design on screen; on a phone they sit below, out of sight of this button. */
  warningCount: number;
  onSave: () => void;
}

/** Saving makes the typed design the device's current one; the CSV is always the saved design's. */
function SaveAndExport({
  code,
  canSave,
  valid,
  unchanged,
  hasSaved,
  saving,
  error,
  justSaved,
  warningCount,
  onSave,
}: SaveAndExportProps) {
  return (
    <View style={styles.stack}>
      {justSaved ? (
        <Notice tone="success" title="Design saved" testID="lens-saved">
          It is now this device’s current design; the radii table below is this design’s.
        </Notice>
      ) : null}
      <FormProblem title="Could not save the design" error={error} />
      {valid && warningCount > 0 ? (
        <Text variant="caption" tone="copper" testID="lens-warning-count">
          {`This design has ${warningCount === 1 ? 'a warning' : `${warningCount} warnings`} with the results; it can still be saved.`}
        </Text>
      ) : null}
      {!canSave ? (
        <Text tone="muted" testID="lens-read-only">
          You can try designs here; saving one is for researchers and lab managers.
        </Text>
      ) : null}
      <View style={styles.actions}>
        {canSave ? (
          <Button
            title={hasSaved ? 'Save as the current design' : 'Save design'}
            icon="save-outline"
            onPress={onSave}
            loading={saving}
            disabled={!valid || unchanged}
            testID="lens-save"
          />
        ) : null}
        <DownloadButton
          href={radiiCsvPath(code)}
          fileName={radiiCsvFileName(code)}
          title="Export radii CSV"
          disabled={!hasSaved || !unchanged}
          testID="lens-export-csv"
        />
      </View>
      {hasSaved && !unchanged ? (
        <Text variant="caption" tone="muted" testID="lens-export-note">
          The radii table holds the saved design. Save these changes to export them.
        </Text>
      ) : null}
      {!hasSaved ? (
        <Text variant="caption" tone="muted">
          Save the design to export its radii table for the lithography step.
        </Text>
      ) : null}
    </View>
  );
}

function SavedDesignFacts({ saved }: { saved: LensDesignEnvelope }) {
  const current = saved.design;
  if (!current) return null;
  return (
    <View style={styles.stack} testID="lens-saved-facts">
      <Text variant="caption" tone="muted">
        {`Current design saved by ${current.createdBy.displayName} on ${formatDateTime(current.createdAt)}: ${formatNumber(current.input.wavelengthNm)} nm, f = ${formatLengthUm(current.input.focalLengthUm)}, ${current.summary.zoneCount} zones.`}
      </Text>
      {current.lithographyStepId !== null ? (
        <TextLink
          href={{ pathname: '/steps/[id]', params: { id: String(current.lithographyStepId) } }}
          testID="lens-lithography-step"
        >
          {`Kept with lithography step ${current.lithographyStepId}`}
        </TextLink>
      ) : null}
      {saved.earlier.length > 0 ? (
        <Text variant="caption" tone="muted" testID="lens-earlier">
          {`Earlier designs: ${saved.earlier
            .map(
              (version) =>
                `${formatNumber(version.wavelengthNm)} nm, f = ${formatLengthUm(version.focalLengthUm)}, ${version.zoneCount} zones (${formatDateTime(version.createdAt)})`,
            )
            .join('; ')}.`}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  left: { flex: 5, gap: space.lg, minWidth: 0 },
  right: { flex: 6, gap: space.lg, minWidth: 0 },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
