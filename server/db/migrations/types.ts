// The shape of one migration: umzug hands it Sequelize's QueryInterface.
import type { QueryInterface } from 'sequelize';

export type Migration = {
  name: string;
  up: (params: { context: QueryInterface }) => Promise<void>;
  down: (params: { context: QueryInterface }) => Promise<void>;
};
