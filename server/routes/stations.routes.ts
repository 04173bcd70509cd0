import type { Transaction } from 'sequelize';
import { stationInputSchema, stationUpdateInputSchema } from '../../src/contract/procedures';
import { idParamSchema } from '../../src/contract/hazards';
import { conflict, notFound } from '../http/errors';
import { route } from '../http/route';
import { CrewAssignment, Station } from '../models';
import { stationDto, stationUses, stationsOf, tx } from '../procedures/procedures';

/** The team's stations are set up by the test conductor or an admin. */
const WRITERS = ['admin', 'conductor'] as const;

async function findStation(teamId: number, id: number, transaction?: Transaction) {
  const s = await Station.findOne({ where: { id, teamId }, transaction });
  if (!s) throw notFound('No such station.');
  return s;
}

function codeTaken(code: string) {
  return conflict(`Your team already has a station with the short code ${code}.`, 'station_code_taken');
}

export function stationRoutes() {
  return [
    route({
      method: 'get',
      path: '/stations',
      access: 'signed-in',
      handler: async ({ user }) => (await stationsOf(user!.teamId)).map(stationDto),
    }),
    route({
      method: 'post',
      path: '/stations',
      access: WRITERS,
      status: 201,
      body: stationInputSchema,
      handler: async ({ body, user }) => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          if (await Station.findOne({ where: { teamId, code: body.code }, transaction: t })) throw codeTaken(body.code);
          return stationDto(await Station.create({ teamId, ...body }, { transaction: t }));
        });
      },
    }),
    route({
      method: 'patch',
      path: '/stations/:id',
      access: WRITERS,
      params: idParamSchema,
      body: stationUpdateInputSchema,
      handler: async ({ params, body, user }) => {
        const teamId = user!.teamId;
        return tx(async (t) => {
          const s = await findStation(teamId, params.id, t);
          if (body.code !== undefined && body.code !== s.code) {
            if (await Station.findOne({ where: { teamId, code: body.code }, transaction: t })) throw codeTaken(body.code);
            // Steps name stations by code: renaming the code would leave them pointing nowhere.
            const uses = await stationUses(teamId, s.code, t);
            if (uses.length) throw conflict(`Procedures use the short code ${s.code} (${uses.join('; ')}), so it cannot change. Change the name or call sign instead.`, 'station_in_use');
          }
          s.set(body);
          await s.save({ transaction: t });
          return stationDto(s);
        });
      },
    }),
    route({
      method: 'delete',
      path: '/stations/:id',
      access: WRITERS,
      params: idParamSchema,
      handler: async ({ params, user }) => {
        const teamId = user!.teamId;
        await tx(async (t) => {
          const s = await findStation(teamId, params.id, t);
          const uses = await stationUses(teamId, s.code, t);
          if (uses.length) throw conflict(`Procedures still use ${s.code}: ${uses.join('; ')}. Remove it from them first.`, 'station_in_use');
          const crew = await CrewAssignment.count({ where: { stationId: s.id }, transaction: t });
          if (crew > 0) throw conflict(`${crew} crew plan assignment(s) still put people at ${s.code}. Remove them first.`, 'station_in_use');
          await s.destroy({ transaction: t });
        });
      },
    }),
  ];
}
