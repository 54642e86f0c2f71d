/**
 * Device cards can leave the library (removed) or give way to a new text under the same name
 * (replaced) while their text stays readable for the specs that recorded them: a retired card
 * keeps its row, gains when and by whom it was retired, how, and which card replaced it, and
 * frees its name (`name_key` becomes `~<id>`, a key no card name can have, so the unique
 * (project, name_key) constraint still means "one card of a name in the library"). Only added
 * nullable columns and an index (the portable Table API).
 */
import { TableColumn, TableIndex, type MigrationInterface, type QueryRunner } from 'typeorm';

const COLUMNS = [
  new TableColumn({ name: 'retired_at', type: 'varchar', length: '32', isNullable: true }),
  new TableColumn({ name: 'retired_by_id', type: 'integer', isNullable: true }),
  new TableColumn({ name: 'retirement', type: 'varchar', length: '20', isNullable: true }),
  new TableColumn({ name: 'replaced_by_id', type: 'integer', isNullable: true }),
];

const CHECKSUM_INDEX = new TableIndex({ name: 'ix_device_model_project_checksum', columnNames: ['project_id', 'checksum'] });

export class DeviceModelRetirement1764800200000 implements MigrationInterface {
  name = 'DeviceModelRetirement1764800200000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.addColumns('device_model', COLUMNS);
    await queryRunner.createIndex('device_model', CHECKSUM_INDEX);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.dropIndex('device_model', CHECKSUM_INDEX.name as string);
    await queryRunner.dropColumns('device_model', COLUMNS.map((column) => column.name));
  }
}
