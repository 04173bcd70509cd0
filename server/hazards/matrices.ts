import { fn, col, type Transaction } from 'sequelize';
import { BUILT_IN_MATRIX_ID, type RiskMatrixDto } from '../../src/contract/hazards';
import { DEFAULT_ACCEPTANCE_MAP, type AcceptanceMap } from '../../src/domain/hazards/acceptance';
import { MIL_STD_882E, type RiskMatrix as RiskMatrixDef } from '../../src/domain/hazards/matrix';
import type { Role } from '../../src/domain/people/roles';
import { badRequest } from '../http/errors';
import { Hazard, RiskMatrix } from '../models';

export interface ResolvedMatrix {
  matrix: RiskMatrixDef;
  acceptanceMap: AcceptanceMap;
  builtIn: boolean;
  createdAt: Date | null;
  /** Only ever set on team matrices; the built-in one is the default when no team matrix is. */
  isDefault: boolean;
  retiredAt: Date | null;
}

const BUILT_IN: ResolvedMatrix = {
  matrix: MIL_STD_882E,
  acceptanceMap: DEFAULT_ACCEPTANCE_MAP,
  builtIn: true,
  createdAt: null,
  isDefault: false,
  retiredAt: null,
};

/** When a team gives no map: the two worst levels need two people, like the built-in map. */
export function defaultAcceptanceMapFor(matrix: RiskMatrixDef): AcceptanceMap {
  const byRank = [...matrix.levels].sort((a, b) => b.rank - a.rank);
  const map: Record<string, Role[]> = {};
  byRank.forEach((level, i) => {
    map[level.key] = i < 2 && byRank.length > 2 ? ['safety', 'admin'] : ['safety'];
  });
  return map;
}

export function fromStored(row: RiskMatrix): ResolvedMatrix {
  const { acceptanceMap, ...shape } = row.definition;
  return {
    matrix: { id: row.key, name: row.name, ...shape },
    acceptanceMap,
    builtIn: false,
    createdAt: row.createdAt,
    isDefault: row.isDefault,
    retiredAt: row.retiredAt ?? null,
  };
}

/** The team's matrix by id, or the built-in one; unknown ids are the caller's mistake (400). */
export async function resolveMatrix(teamId: number, matrixId: string, transaction?: Transaction, field = 'matrixId'): Promise<ResolvedMatrix> {
  if (matrixId === BUILT_IN_MATRIX_ID) return BUILT_IN;
  const row = await RiskMatrix.findOne({ where: { teamId, key: matrixId }, transaction });
  if (!row) throw badRequest(`There is no risk matrix '${matrixId}'.`, 'unknown_matrix', [{ path: field, message: `Unknown matrix '${matrixId}'.` }]);
  return fromStored(row);
}

export async function listMatrices(teamId: number): Promise<ResolvedMatrix[]> {
  const rows = await RiskMatrix.findAll({ where: { teamId }, order: [['name', 'ASC']] });
  return [BUILT_IN, ...rows.map(fromStored)];
}

/** The matrix a new hazard gets when none is named: the team's chosen default, else the built-in one. */
export async function defaultMatrixId(teamId: number, transaction?: Transaction): Promise<string> {
  const row = await RiskMatrix.findOne({ where: { teamId, isDefault: true, retiredAt: null }, transaction });
  return row ? row.key : BUILT_IN_MATRIX_ID;
}

/** Hazards per matrix id for one team. */
export async function hazardCounts(teamId: number, transaction?: Transaction): Promise<Map<string, number>> {
  const rows = (await Hazard.findAll({
    where: { teamId },
    attributes: ['matrixId', [fn('COUNT', col('id')), 'n']],
    group: ['matrixId'],
    raw: true,
    transaction,
  })) as unknown as { matrixId: string; n: number | string }[];
  return new Map(rows.map((r) => [r.matrixId, Number(r.n)]));
}

export function toMatrixDto(m: ResolvedMatrix, hazardCount = 0, teamHasDefault = false): RiskMatrixDto {
  const acceptanceMap: Record<string, Role[]> = {};
  for (const [k, v] of Object.entries(m.acceptanceMap)) acceptanceMap[k] = [...v];
  return {
    id: m.matrix.id,
    name: m.matrix.name,
    builtIn: m.builtIn,
    severities: m.matrix.severities.map((s) => ({ ...s })),
    likelihoods: m.matrix.likelihoods.map((l) => ({ ...l })),
    levels: m.matrix.levels.map((l) => ({ ...l })),
    cells: m.matrix.cells,
    acceptanceMap,
    createdAt: m.createdAt ? m.createdAt.toISOString() : null,
    isDefault: m.builtIn ? !teamHasDefault : m.isDefault && m.retiredAt === null,
    retired: m.retiredAt !== null,
    retiredAt: m.retiredAt ? m.retiredAt.toISOString() : null,
    hazardCount,
  };
}

/** On the wire the built-in matrix's severities are numbers 1..4; team keys stay strings. */
export function severityOut(matrixId: string, key: string): number | string {
  return matrixId === BUILT_IN_MATRIX_ID ? Number(key) : key;
}
