import type { EvidenceAnalysis, EvidenceKind, EvidenceMetadata, StoredMediaType } from '../../shared/schemas/evidence';
import type { LayerMethod } from '../../shared/schemas/evidence-analysis';
import { BaseModel } from './base-model';
import { UserModel } from './user-model';

/** One distinct file content; its SHA-256 is both its identity and its storage key. */
export class StoredFileModel extends BaseModel {
  static override tableName = 'stored_files';

  id!: number;
  sha256!: string;
  byteSize!: number;
  mediaType!: StoredMediaType;
  widthPx!: number | null;
  heightPx!: number | null;
  thumbnailSha256!: string | null;
  createdById!: number | null;
  createdAt!: Date;
}

/** µm per pixel of one microscope and objective; retired ones stay so old micrographs can name them. */
export class MicroscopeCalibrationModel extends BaseModel {
  static override tableName = 'microscope_calibrations';

  id!: number;
  microscope!: string;
  objectiveMagnification!: number;
  umPerPixel!: number;
  note!: string | null;
  createdById!: number | null;
  createdAt!: Date;
  retiredAt!: Date | null;
  createdBy?: UserModel | null;

  static override relationMappings = () => ({
    createdBy: {
      relation: BaseModel.BelongsToOneRelation,
      modelClass: UserModel,
      join: { from: 'microscope_calibrations.createdById', to: 'users.id' },
    },
  });
}

/** A micrograph, spectrum or profile attached to a sample or a step, with what was computed from it. */
export class EvidenceModel extends BaseModel {
  static override tableName = 'evidence';
  static override tracksUpdatedAt = true;
  static override jsonAttributes = ['metadata', 'analysis'];

  id!: number;
  sampleId!: number | null;
  stepId!: number | null;
  kind!: EvidenceKind;
  fileId!: number;
  originalName!: string | null;
  metadata!: EvidenceMetadata;
  analysis!: EvidenceAnalysis;
  layerCount!: number | null;
  layerUncertainty!: number | null;
  layerMethod!: LayerMethod | null;
  createdById!: number | null;
  createdAt!: Date;
  updatedAt!: Date;
  version!: number;
  file?: StoredFileModel;
  createdBy?: UserModel | null;

  static override relationMappings = () => ({
    file: {
      relation: BaseModel.BelongsToOneRelation,
      modelClass: StoredFileModel,
      join: { from: 'evidence.fileId', to: 'stored_files.id' },
    },
    createdBy: {
      relation: BaseModel.BelongsToOneRelation,
      modelClass: UserModel,
      join: { from: 'evidence.createdById', to: 'users.id' },
    },
  });
}
