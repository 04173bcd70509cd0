import { route } from '../http/route';
import { MailMessage } from '../models';

export const mailRoutes = [
  route({
    method: 'get',
    path: '/mail/outbox',
    access: ['admin'],
    handler: async () => {
      const messages = await MailMessage.findAll({ order: [['sentAt', 'DESC'], ['id', 'DESC']], limit: 200 });
      return messages.map((m) => m.toDto());
    },
  }),
];
