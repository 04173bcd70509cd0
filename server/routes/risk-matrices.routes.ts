import type { Transaction } from 'sequelize';
import { z } from 'zod';
import {
  BUILT_IN_MATRIX_ID,
  matrixIdSchema,
  riskMatrixInputSchema,
  riskMatrixUpdateInputSchema,
  type RiskMatrixDto,
} from '../../src/contract/hazards';
import { checkAcceptanceMap, type AcceptanceMap } from '../../src/domain/hazards/acceptance';
import { LEVEL_GLYPHS, validateMatrix, type RiskMatrix as RiskMatrixDef } from '../../src/domain/hazards/matrix';
import { checkLevelPalette, withPaletteDefaults } from '../../src/domain/hazards/palette';
import { badRequest, conflict, HttpError, notFound } from '../http/errors';
import { route } from '../http/route';
import { defaultAcceptanceMapFor, hazardCounts, listMatrices, resolveMatrix, toMatrixDto } from '../hazards/matrices';
import { RiskMatrix } from '../models';
import type { StoredMatrixDefinition } from '../models/risk-matrix.model';

const matrixParams = z.strictObject({ id: matrixIdSchema });
const WRITERS = ['safety', 'admin'] as const;

type MatrixBody = z.output<typeof riskMatrixUpdateInputSchema>;

const tx = <T>(fn: (t: Transaction) => Promise<T>) => RiskMatrix.sequelize!.transaction(fn);

/**
 * The same checks the editor runs before sending: shape and cells (validateMatrix), palette colours and
 * distinct shapes (checkLevelPalette), and who accepts each level (checkAcceptanceMap). All problems come
 * back at once, each with the path of the field it is about.
 */
function checkedDefinition(id: string, body: MatrixBody): { matrix: RiskMatrixDef; acceptanceMap: AcceptanceMap } {
  const { acceptanceMap: givenMap, name, severities, likelihoods, cells } = body;
  const levels = withPaletteDefaults(body.levels, LEVEL_GLYPHS);
  const matrix: RiskMatrixDef = { id, name, severities, likelihoods, levels, cells };
  const problems = [...validateMatrix(matrix), ...checkLevelPalette(levels)].map((p) => ({ path: p.path, message: p.message }));
  const acceptanceMap: AcceptanceMap = givenMap ?? defaultAcceptanceMapFor(matrix);
  const mapProblems = checkAcceptanceMap(acceptanceMap, matrix).map((p) => ({
    path: p.level && matrix.levels.some((l) => l.key === p.level) ? `acceptanceMap.${p.level}` : 'acceptanceMap',
    message: p.message,
  }));
  if (problems.length) throw badRequest('The matrix is not usable as it stands.', 'invalid_matrix', [...problems, ...mapProblems]);
  if (mapProblems.length) throw badRequest('The acceptance map does not fit the matrix.', 'invalid_acceptance_map', mapProblems);
  return { matrix, acceptanceMap };
}

function storedOf(matrix: RiskMatrixDef, acceptanceMap: AcceptanceMap): StoredMatrixDefinition {
  const { severities, likelihoods, levels, cells } = matrix;
  return { severities, likelihoods, levels, cells, acceptanceMap };
}

async function teamRow(teamId: number, key: string, t: Transaction, verb: string): Promise<RiskMatrix> {
  if (key === BUILT_IN_MATRIX_ID) throw conflict(`The built-in matrix cannot be ${verb}.`, 'builtin_matrix');
  const row = await RiskMatrix.findOne({ where: { teamId, key }, transaction: t });
  if (!row) throw notFound(`There is no risk matrix '${key}'.`);
  return row;
}

async function dtoOf(teamId: number, key: string, t?: Transaction): Promise<RiskMatrixDto> {
  const counts = await hazardCounts(teamId, t);
  const m = await resolveMatrix(teamId, key, t);
  const teamHasDefault = (await RiskMatrix.count({ where: { teamId, isDefault: true, retiredAt: null }, transaction: t })) > 0;
  return toMatrixDto(m, counts.get(key) ?? 0, teamHasDefault);
}

export function riskMatrixRoutes() {
  return [
    route({
      method: 'get',
      path: '/risk-matrices',
      access: 'signed-in',
      handler: async ({ user }) => {
        const teamId = user!.teamId;
        const [all, counts] = await Promise.all([listMatrices(teamId), hazardCounts(teamId)]);
        const teamHasDefault = all.some((m) => !m.builtIn && m.isDefault && m.retiredAt === null);
        return all.map((m) => toMatrixDto(m, counts.get(m.matrix.id) ?? 0, teamHasDefault));
      },
    }),
    route({
      method: 'get',
      path: '/risk-matrices/:id',
      access: 'signed-in',
      params: matrixParams,
      handler: async ({ params, user }) => {
        try {
          return await dtoOf(user!.teamId, params.id);
        } catch (error) {
          if (error instanceof HttpError) throw badRequest(`There is no risk matrix '${params.id}'.`, 'unknown_matrix');
          throw error;
        }
      },
    }),
    route({
      method: 'post',
      path: '/risk-matrices',
      access: WRITERS,
      status: 201,
      body: riskMatrixInputSchema,
      handler: async ({ body, user }) => {
        const { id, ...rest } = body;
        const { matrix, acceptanceMap } = checkedDefinition(id, rest);
        const teamId = user!.teamId;
        return tx(async (t) => {
          if (id === BUILT_IN_MATRIX_ID || (await RiskMatrix.count({ where: { teamId, key: id }, transaction: t }))) {
            throw conflict(`A matrix with id '${id}' already exists.`, 'matrix_exists');
          }
          await RiskMatrix.create({ teamId, key: id, name: matrix.name, definition: storedOf(matrix, acceptanceMap), createdById: user!.id }, { transaction: t });
          return dtoOf(teamId, id, t);
        });
      },
    }),
    route({
      method: 'put',
      path: '/risk-matrices/:id',
      access: WRITERS,
      params: matrixParams,
      body: riskMatrixUpdateInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          const row = await teamRow(teamId, params.id, t, 'changed');
          // A hazard keeps the matrix it was assessed with: once one has been, the matrix is frozen.
          const used = (await hazardCounts(teamId, t)).get(params.id) ?? 0;
          if (used > 0) {
            throw conflict(
              `${used} ${used === 1 ? 'hazard was' : 'hazards were'} assessed with this matrix, so it can no longer change. Define a new matrix, or retire this one.`,
              'matrix_in_use',
            );
          }
          const { matrix, acceptanceMap } = checkedDefinition(params.id, body);
          row.name = matrix.name;
          row.definition = storedOf(matrix, acceptanceMap);
          row.changed('definition', true);
          await row.save({ transaction: t });
          return dtoOf(teamId, params.id, t);
        });
      },
    }),
    route({
      method: 'post',
      path: '/risk-matrices/:id/retire',
      access: WRITERS,
      params: matrixParams,
      handler: async ({ params, user }) => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          const row = await teamRow(teamId, params.id, t, 'retired');
          if (row.retiredAt === null) {
            row.retiredAt = new Date();
            // A retired matrix cannot stay the default: new hazards fall back to the built-in matrix.
            row.isDefault = false;
            await row.save({ transaction: t });
          }
          return dtoOf(teamId, params.id, t);
        });
      },
    }),
    route({
      method: 'post',
      path: '/risk-matrices/:id/reinstate',
      access: WRITERS,
      params: matrixParams,
      handler: async ({ params, user }) => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          const row = await teamRow(teamId, params.id, t, 'reinstated');
          if (row.retiredAt !== null) {
            row.retiredAt = null;
            await row.save({ transaction: t });
          }
          return dtoOf(teamId, params.id, t);
        });
      },
    }),
    route({
      method: 'post',
      path: '/risk-matrices/:id/default',
      access: WRITERS,
      params: matrixParams,
      handler: async ({ params, user }) => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          let row: RiskMatrix | null = null;
          if (params.id !== BUILT_IN_MATRIX_ID) {
            row = await RiskMatrix.findOne({ where: { teamId, key: params.id }, transaction: t });
            if (!row) throw notFound(`There is no risk matrix '${params.id}'.`);
            if (row.retiredAt !== null) throw conflict('A retired matrix cannot be the default. Reinstate it first.', 'matrix_retired');
          }
          await RiskMatrix.update({ isDefault: false }, { where: { teamId, isDefault: true }, transaction: t });
          if (row) {
            row.isDefault = true;
            await row.save({ transaction: t });
          }
          return dtoOf(teamId, params.id, t);
        });
      },
    }),
  ];
}
