import { Model } from 'objection';

/** Shared behaviour for every table model. Column names map to snake_case in SQL (see db/knex.ts). */
export class BaseModel extends Model {
  /** Tables with an `updated_at` column set this so every patch moves it. */
  static tracksUpdatedAt = false;

  override $beforeUpdate(): void {
    if ((this.constructor as typeof BaseModel).tracksUpdatedAt) {
      (this as { updatedAt?: Date }).updatedAt = new Date();
    }
  }
}
