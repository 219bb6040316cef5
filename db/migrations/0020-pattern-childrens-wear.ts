import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

// The designer's own word that a pattern is made for children, whatever its garment category (a
// children's hoodie filed as a top or a jacket), so the children's safety cautions are shown.
export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.addColumn('patterns', 'childrens_wear', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false }, { transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.removeColumn('patterns', 'childrens_wear', { transaction });
  });
};
