/**
 * Every Sequelize model, initialised on one connection, with its associations.
 * Only repositories (server/<resource>/*.repository.ts) and the seed touch models.
 */
import type { Sequelize } from 'sequelize';
import { Studio, initStudio } from './studio';
import { Team, initTeam } from './team';

export { Studio, Team };

export function initModels(sequelize: Sequelize): void {
  initStudio(sequelize);
  initTeam(sequelize);
  Studio.hasMany(Team, { foreignKey: 'studioId', as: 'teams' });
  Team.belongsTo(Studio, { foreignKey: 'studioId', as: 'studio' });
}
