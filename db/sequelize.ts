import { Sequelize } from 'sequelize';
import { initModels } from './models';

export type SequelizeOptions = {
  poolMax?: number;
  logging?: boolean;
  /**
   * Models are module-level classes bound to one instance; a second instance that registers them
   * takes them over. Pass false for an extra connection that must leave them alone.
   */
  registerModels?: boolean;
};

/** One Sequelize instance with every model registered and associated. */
export function createSequelize(databaseUrl: string, options: SequelizeOptions = {}): Sequelize {
  const sequelize = new Sequelize(databaseUrl, {
    dialect: 'postgres',
    logging: options.logging ? (sql) => console.log(sql) : false,
    pool: { max: options.poolMax ?? 10, min: 0, idle: 10_000 },
    define: { underscored: true },
  });
  if (options.registerModels !== false) initModels(sequelize);
  return sequelize;
}
