import { propellantCautionsInputSchema, propellantParamSchema, type HistoryEntryDto, type PropellantDto } from '../../src/contract/hazards';
import { PROPELLANT_IDS, PROPELLANTS, type PropellantId } from '../../src/domain/propellants/library';
import { route } from '../http/route';
import { PropellantCautionHistory, PropellantCautionOverride } from '../models';

function toDto(id: PropellantId, override: PropellantCautionOverride | null): PropellantDto {
  const p = PROPELLANTS[id];
  return {
    id: p.id,
    name: p.name,
    role: p.role,
    state: p.state,
    properties: p.properties.map((v) => ({ ...v, value: typeof v.value === 'number' ? v.value : [v.value[0], v.value[1]] })),
    cautions: (override?.cautions ?? p.cautions).map((c) => ({ ...c })),
    ppe: [...(override?.ppe ?? p.ppe)],
    cautionsEdited: override !== null,
    cautionsEditedBy: override?.updatedByName ?? null,
    cautionsEditedAt: override ? override.updatedAt.toISOString() : null,
  };
}

export function propellantRoutes() {
  return [
    route({
      method: 'get',
      path: '/propellants',
      access: 'signed-in',
      handler: async ({ user }) => {
        const overrides = await PropellantCautionOverride.findAll({ where: { teamId: user!.teamId } });
        return PROPELLANT_IDS.map((id) => toDto(id, overrides.find((o) => o.propellantId === id) ?? null));
      },
    }),
    route({
      method: 'get',
      path: '/propellants/:id',
      access: 'signed-in',
      params: propellantParamSchema,
      handler: async ({ params, user }) =>
        toDto(params.id, await PropellantCautionOverride.findOne({ where: { teamId: user!.teamId, propellantId: params.id } })),
    }),
    route({
      method: 'patch',
      path: '/propellants/:id/cautions',
      // Cautions are the safety officer's word; admins do not override them.
      access: ['safety'],
      params: propellantParamSchema,
      body: propellantCautionsInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        return PropellantCautionOverride.sequelize!.transaction(async (transaction) => {
          const existing = await PropellantCautionOverride.findOne({ where: { teamId, propellantId: params.id }, transaction });
          const current = toDto(params.id, existing);
          const before = { cautions: current.cautions, ppe: current.ppe };
          const ppe = body.ppe ?? current.ppe;
          const after = { cautions: body.cautions, ppe };
          if (existing) {
            existing.cautions = body.cautions;
            existing.ppe = ppe;
            existing.updatedById = user!.id;
            existing.updatedByName = user!.name;
            existing.changed('updatedAt', true);
            await existing.save({ transaction });
          } else {
            await PropellantCautionOverride.create(
              { teamId, propellantId: params.id, cautions: body.cautions, ppe, updatedById: user!.id, updatedByName: user!.name },
              { transaction },
            );
          }
          await PropellantCautionHistory.create(
            { teamId, propellantId: params.id, userId: user!.id, userName: user!.name, before, after },
            { transaction },
          );
          return toDto(params.id, await PropellantCautionOverride.findOne({ where: { teamId, propellantId: params.id }, transaction }));
        });
      },
    }),
    route({
      method: 'get',
      path: '/propellants/:id/history',
      access: 'signed-in',
      params: propellantParamSchema,
      handler: async ({ params, user }): Promise<HistoryEntryDto[]> => {
        const rows = await PropellantCautionHistory.findAll({
          where: { teamId: user!.teamId, propellantId: params.id },
          order: [['id', 'ASC']],
        });
        return rows.map((r) => ({
          id: r.id,
          userId: r.userId,
          userName: r.userName,
          field: 'cautions',
          before: r.before,
          after: r.after,
          at: r.createdAt.toISOString(),
        }));
      },
    }),
  ];
}
