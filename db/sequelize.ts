import { Sequelize } from 'sequelize';
import { initModels } from './models';

export type SequelizeOptions = { poolMax?: number; logging?: boolean };

/** One Sequelize instance with every model registered and associated. */
export function createSequelize(databaseUrl: string, options: SequelizeOptions = {}): Sequelize {
  const sequelize = new Sequelize(databaseUrl, {
    dialect: 'postgres',
    logging: options.logging ? (sql) => console.log(sql) : false,
    pool: { max: options.poolMax ?? 10, min: 0, idle: 10_000 },
    define: { underscored: true },
  });
  initModels(sequelize);
  return sequelize;
}
