import type { AxisLabels } from '../../shared/slots';
import { BaseModel } from './base-model';

export class StoragePlaceModel extends BaseModel {
  static override tableName = 'storage_places';

  id!: number;
  name!: string;
  kind!: string;
  parentId!: number | null;
  note!: string | null;
  createdAt!: Date;
}

export class BoxModel extends BaseModel {
  static override tableName = 'boxes';
  static override tracksUpdatedAt = true;

  id!: number;
  code!: string;
  name!: string;
  placeId!: number | null;
  rows!: number;
  columns!: number;
  rowLabels!: AxisLabels;
  columnLabels!: AxisLabels;
  note!: string | null;
  createdAt!: Date;
  updatedAt!: Date;
}

export class LabelTemplateModel extends BaseModel {
  static override tableName = 'label_templates';

  id!: number;
  name!: string;
  shape!: 'round' | 'rectangle';
  labelWidthMm!: number;
  labelHeightMm!: number;
  pageWidthMm!: number;
  pageHeightMm!: number;
  columns!: number;
  rows!: number;
  marginLeftMm!: number;
  marginTopMm!: number;
  columnGapMm!: number;
  rowGapMm!: number;
  builtIn!: boolean;
  createdById!: number | null;
  createdAt!: Date;
}
