import { z } from 'zod';
import { BUILT_IN_MATRIX_ID, matrixIdSchema, riskMatrixInputSchema } from '../../src/contract/hazards';
import { validateAcceptanceMap, type AcceptanceMap } from '../../src/domain/hazards/acceptance';
import { validateMatrix, type RiskMatrix as RiskMatrixDef } from '../../src/domain/hazards/matrix';
import { badRequest, conflict } from '../http/errors';
import { route } from '../http/route';
import { defaultAcceptanceMapFor, listMatrices, resolveMatrix, toMatrixDto } from '../hazards/matrices';
import { RiskMatrix } from '../models';

const matrixParams = z.strictObject({ id: matrixIdSchema });

export function riskMatrixRoutes() {
  return [
    route({
      method: 'get',
      path: '/risk-matrices',
      access: 'signed-in',
      handler: async ({ user }) => (await listMatrices(user!.teamId)).map(toMatrixDto),
    }),
    route({
      method: 'get',
      path: '/risk-matrices/:id',
      access: 'signed-in',
      params: matrixParams,
      handler: async ({ params, user }) => {
        try {
          return toMatrixDto(await resolveMatrix(user!.teamId, params.id));
        } catch {
          throw badRequest(`There is no risk matrix '${params.id}'.`, 'unknown_matrix');
        }
      },
    }),
    route({
      method: 'post',
      path: '/risk-matrices',
      access: ['safety', 'admin'],
      status: 201,
      body: riskMatrixInputSchema,
      handler: async ({ body, user }) => {
        const { acceptanceMap: givenMap, ...shape } = body;
        const matrix: RiskMatrixDef = shape;
        const problems = validateMatrix(matrix).map((p) => ({ path: p.path, message: p.message }));
        if (problems.length) throw badRequest('The matrix is not usable as it stands.', 'invalid_matrix', problems);
        const acceptanceMap: AcceptanceMap = givenMap ?? defaultAcceptanceMapFor(matrix);
        const mapProblems = validateAcceptanceMap(acceptanceMap, matrix).map((message) => ({ path: 'acceptanceMap', message }));
        if (mapProblems.length) throw badRequest('The acceptance map does not fit the matrix.', 'invalid_acceptance_map', mapProblems);
        if (body.id === BUILT_IN_MATRIX_ID || (await RiskMatrix.count({ where: { teamId: user!.teamId, key: body.id } }))) {
          throw conflict(`A matrix with id '${body.id}' already exists.`, 'matrix_exists');
        }
        const { id, name, ...definition } = matrix;
        await RiskMatrix.create({ teamId: user!.teamId, key: id, name, definition: { ...definition, acceptanceMap }, createdById: user!.id });
        return toMatrixDto(await resolveMatrix(user!.teamId, id));
      },
    }),
  ];
}
