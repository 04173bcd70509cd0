import {
  oxygenQuerySchema,
  propellantMassQuerySchema,
  quantityDistanceQuerySchema,
  riskCalcQuerySchema,
  surgeQuerySchema,
} from '../../src/contract/hazards';
import { route } from '../http/route';
import { calcOxygen, calcPropellantMass, calcQuantityDistance, calcRisk, calcSurge } from '../hazards/calc';

export function calcRoutes() {
  return [
    route({ method: 'get', path: '/calc/risk', access: 'signed-in', query: riskCalcQuerySchema, handler: ({ query, user }) => calcRisk(user!.teamId, query) }),
    route({ method: 'get', path: '/calc/propellant-mass', access: 'signed-in', query: propellantMassQuerySchema, handler: ({ query }) => calcPropellantMass(query) }),
    route({
      method: 'get',
      path: '/calc/quantity-distance',
      access: 'signed-in',
      query: quantityDistanceQuerySchema,
      handler: ({ query }) => calcQuantityDistance(query),
    }),
    route({ method: 'get', path: '/calc/surge', access: 'signed-in', query: surgeQuerySchema, handler: ({ query }) => calcSurge(query) }),
    route({ method: 'get', path: '/calc/oxygen', access: 'signed-in', query: oxygenQuerySchema, handler: ({ query }) => calcOxygen(query) }),
  ];
}
