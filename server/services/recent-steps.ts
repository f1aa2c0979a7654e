import type { Knex } from 'knex';
import type { StepListFilters } from '../../shared/schemas/step';
import { StepModel } from '../models/step-model';
import type { UserModel } from '../models/user-model';

/**
 * The newest steps first (by when they were logged), for the bench view and "repeat my last
 * run". `mine` means steps the person logged or was the operator of: a run logged for someone
 * else is still theirs to repeat.
 */
export async function recentSteps(props: { trx: Knex; viewer: UserModel; filters: StepListFilters }): Promise<StepModel[]> {
  const { trx, viewer, filters } = props;
  const query = StepModel.query(trx);
  if (filters.mine) {
    query.where((mine) => mine.where('createdById', viewer.id).orWhere('operatorId', viewer.id));
  }
  if (filters.type) query.where('type', filters.type);
  // The id breaks ties between steps logged in the same transaction.
  return query.orderBy('createdAt', 'desc').orderBy('id', 'desc').limit(filters.limit);
}
