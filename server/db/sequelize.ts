import { Sequelize } from 'sequelize';

/** One Sequelize instance per process, over pg. SQL is not logged (it can carry secrets). */
export function createSequelize(databaseUrl: string, poolMax = 10): Sequelize {
  return new Sequelize(databaseUrl, {
    dialect: 'postgres',
    logging: false,
    pool: { max: poolMax, min: 0, idle: 10_000, acquire: 20_000 },
    define: { underscored: true, timestamps: true },
  });
}
