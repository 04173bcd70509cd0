import { route } from '../http/route';

export const healthRoutes = [
  route({ method: 'get', path: '/health', access: 'public', handler: () => ({ status: 'ok' }) }),
];
