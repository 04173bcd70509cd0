/**
 * For the live count: may a count run from this revision? Only the latest released revision of a procedure,
 * signed by a test conductor and a safety officer, can be counted; a draft never.
 */
import type { Transaction } from 'sequelize';
import { countability, type Countability } from '../../src/domain/procedures/release';
import { stepCount } from '../../src/domain/procedures/steps';
import { HttpError } from '../http/errors';
import type { ProcedureRevision } from '../models';
import { findProcedure, findRevision, latestReleasedNumber } from './procedures';

/** Whether revision `number` of the procedure can be counted, and why not. 404 when there is no such revision. */
export async function revisionCountability(
  teamId: number,
  procedureId: number,
  number: number,
  transaction?: Transaction,
): Promise<Countability & { revision: ProcedureRevision }> {
  const p = await findProcedure(teamId, procedureId, transaction);
  const revision = findRevision(p, number);
  const c = countability({ status: revision.status, number: revision.number, stepCount: stepCount(revision.phases) }, latestReleasedNumber(p));
  return { ...c, revision };
}

export async function isRevisionCountable(teamId: number, procedureId: number, number: number, transaction?: Transaction): Promise<boolean> {
  return (await revisionCountability(teamId, procedureId, number, transaction)).countable;
}

/** The revision to count from, or a 409 `not_countable` whose message says why. */
export async function countableRevision(teamId: number, procedureId: number, number: number, transaction?: Transaction): Promise<ProcedureRevision> {
  const c = await revisionCountability(teamId, procedureId, number, transaction);
  if (!c.countable) throw new HttpError(409, 'not_countable', c.message);
  return c.revision;
}
