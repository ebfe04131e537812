import type { Sequelize } from 'sequelize';
import { route } from '../http/route';

export const healthRoutes = (sequelize: Sequelize) => [
  route({
    method: 'get',
    path: '/api/health',
    access: 'public',
    summary: 'Application and database status',
    handler: async ({ res }) => {
      const database = await sequelize
        .authenticate()
        .then(() => 'ok' as const)
        .catch(() => 'down' as const);
      if (database === 'down') res.status(503);
      return { app: 'ok', database };
    },
  }),
];
