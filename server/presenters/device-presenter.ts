import type { DeviceMeasurement, LabSettings, LensDesign, LensDesignVersion } from '../../shared/schemas/device';
import type { ZonePlateDesignSummary } from '../../shared/schemas/zone-plate';
import { DEFAULT_MIN_FEATURE_NM } from '../../shared/zone-plate/limits';
import type { DeviceMeasurementModel, LabSettingsModel, LensDesignModel } from '../models/device-models';
import type { UserModel } from '../models/user-model';
import { warningsAgainst } from '../services/lens-designs';
import { predictionFor } from '../services/measurement-predictions';

const personRef = (person: UserModel | null | undefined, id: number | null) =>
  person ? { id: person.id, displayName: person.displayName } : { id: id ?? 0, displayName: 'Unknown' };

export function presentLabSettings(row: LabSettingsModel | null, updatedBy: UserModel | null): LabSettings {
  return {
    minFeatureNm: row?.minFeatureNm ?? DEFAULT_MIN_FEATURE_NM,
    isDefault: row === null,
    updatedAt: row?.updatedAt.toISOString() ?? null,
    updatedBy: row && updatedBy ? { id: updatedBy.id, displayName: updatedBy.displayName } : null,
  };
}

export function presentLensDesign(design: LensDesignModel, deviceCode: string, labMinFeatureNm: number): LensDesign {
  return {
    id: design.id,
    deviceCode,
    lithographyStepId: design.stepId,
    input: design.input,
    summary: design.summary,
    warnings: warningsAgainst(design, labMinFeatureNm),
    labMinFeatureNm,
    createdBy: personRef(design.createdBy, design.createdById),
    createdAt: design.createdAt.toISOString(),
  };
}

export function presentLensDesignVersion(design: LensDesignModel): LensDesignVersion {
  return {
    id: design.id,
    wavelengthNm: design.summary.wavelengthNm,
    focalLengthUm: design.summary.focalLengthUm,
    zoneCount: design.summary.zoneCount,
    lensDiameterUm: design.summary.lensDiameterUm,
    createdBy: personRef(design.createdBy, design.createdById),
    createdAt: design.createdAt.toISOString(),
  };
}

export function presentMeasurement(
  measurement: DeviceMeasurementModel,
  deviceCode: string,
  design: ZonePlateDesignSummary | null,
): DeviceMeasurement {
  return {
    id: measurement.id,
    deviceCode,
    kind: measurement.kind,
    rows: measurement.rows,
    instrument: measurement.instrument,
    note: measurement.note,
    measuredAt: measurement.measuredAt.toISOString(),
    measuredBy: personRef(measurement.measuredBy, measurement.measuredById),
    createdAt: measurement.createdAt.toISOString(),
    prediction: predictionFor(measurement.kind, measurement.rows, design),
  };
}
