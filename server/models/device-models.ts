import type { LensDesignInputRecord, MeasurementKind, MeasurementRow } from '../../shared/schemas/device';
import type { ZonePlateDesignSummary } from '../../shared/schemas/zone-plate';
import { BaseModel } from './base-model';
import { UserModel } from './user-model';

/** The lab's settings: one row (id 1) once a manager has saved them. */
export class LabSettingsModel extends BaseModel {
  static override tableName = 'lab_settings';

  id!: number;
  minFeatureNm!: number;
  updatedById!: number | null;
  updatedAt!: Date;
}

/** One saved zone-plate design of a device; the newest per device is the current one. */
export class LensDesignModel extends BaseModel {
  static override tableName = 'lens_designs';
  static override jsonAttributes = ['input', 'summary'];

  id!: number;
  deviceId!: number;
  stepId!: number | null;
  input!: LensDesignInputRecord;
  summary!: ZonePlateDesignSummary;
  createdById!: number;
  createdAt!: Date;
  createdBy?: UserModel;

  static override relationMappings = () => ({
    createdBy: {
      relation: BaseModel.BelongsToOneRelation,
      modelClass: UserModel,
      join: { from: 'lens_designs.createdById', to: 'users.id' },
    },
  });
}

export class DeviceMeasurementModel extends BaseModel {
  static override tableName = 'device_measurements';
  static override jsonAttributes = ['rows'];

  id!: number;
  deviceId!: number;
  kind!: MeasurementKind;
  rows!: MeasurementRow[];
  instrument!: string | null;
  note!: string | null;
  measuredAt!: Date;
  measuredById!: number;
  createdAt!: Date;
  measuredBy?: UserModel;

  static override relationMappings = () => ({
    measuredBy: {
      relation: BaseModel.BelongsToOneRelation,
      modelClass: UserModel,
      join: { from: 'device_measurements.measuredById', to: 'users.id' },
    },
  });
}
