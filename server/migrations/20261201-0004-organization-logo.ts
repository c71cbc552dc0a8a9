import { DataTypes, type QueryInterface } from 'sequelize';

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('organizations', 'logo_file_id', {
    type: DataTypes.UUID, allowNull: true, references: { model: 'stored_files', key: 'id' }, onDelete: 'SET NULL',
  });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('organizations', 'logo_file_id');
}
