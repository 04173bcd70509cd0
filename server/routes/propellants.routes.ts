import { propellantCautionsInputSchema, propellantParamSchema, type HistoryEntryDto, type PropellantDto } from '../../src/contract/hazards';
import { PROPELLANT_IDS, PROPELLANTS, type HandlingCaution, type PpeItem, type PropellantId } from '../../src/domain/propellants/library';
import { route } from '../http/route';
import { PropellantCautionHistory, PropellantCautionOverride } from '../models';

// Edits saved before each item kept its source say so rather than inventing one.
const SOURCE_NOT_RECORDED = 'not recorded (edited before sources were kept)';
const cautionOut = (c: Partial<HandlingCaution> & Pick<HandlingCaution, 'key' | 'severity' | 'text'>) => ({
  key: c.key,
  severity: c.severity,
  text: c.text,
  source: c.source ?? SOURCE_NOT_RECORDED,
});
const ppeOut = (item: PpeItem | string): PpeItem =>
  typeof item === 'string' ? { text: item, source: SOURCE_NOT_RECORDED } : { text: item.text, source: item.source };

function toDto(id: PropellantId, override: PropellantCautionOverride | null): PropellantDto {
  const p = PROPELLANTS[id];
  return {
    id: p.id,
    name: p.name,
    role: p.role,
    state: p.state,
    properties: p.properties.map((v) => ({ ...v, value: typeof v.value === 'number' ? v.value : [v.value[0], v.value[1]] })),
    cautions: (override?.cautions ?? p.cautions).map(cautionOut),
    ppe: (override?.ppe ?? p.ppe).map(ppeOut),
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
          // Saving without a change leaves no history line.
          if (JSON.stringify(before) === JSON.stringify(after)) return current;
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
