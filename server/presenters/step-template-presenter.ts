import type { StepTemplate } from '../../shared/schemas/step-template';
import type { StepTemplateModel } from '../models/step-template-model';

export const presentStepTemplate = (template: StepTemplateModel): StepTemplate => ({
  id: template.id,
  name: template.name,
  type: template.type,
  body: template.body,
  createdAt: template.createdAt.toISOString(),
});
