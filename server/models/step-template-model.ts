import type { StepType } from '../../shared/steps';
import type { StepTemplate } from '../../shared/schemas/step-template';
import { BaseModel } from './base-model';

export class StepTemplateModel extends BaseModel {
  static override tableName = 'step_templates';
  static override jsonAttributes = ['body'];

  id!: number;
  userId!: number;
  name!: string;
  type!: StepType;
  body!: StepTemplate['body'];
  createdAt!: Date;
}
