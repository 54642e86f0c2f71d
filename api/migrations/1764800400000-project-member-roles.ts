/**
 * Roles per project: each membership carries the role the person holds in that project, and the
 * account's own role keeps only what is global (administrator, or member). Existing memberships
 * take the person's role at the time; an administrator's memberships get no project role (the
 * administrator role is not one a project grants). Then every account that is not an
 * administrator becomes a member. Adds a nullable column and moves data only; the same
 * query-builder statements run on SQLite and PostgreSQL.
 */
import { TableColumn, type MigrationInterface, type QueryRunner } from 'typeorm';

/** The roles a membership can take over from the account (the project roles of that time). */
const PROJECT_ROLES_THEN = ['requirements', 'designer', 'reviewer'] as const;

export class ProjectMemberRoles1764800400000 implements MigrationInterface {
  name = 'ProjectMemberRoles1764800400000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.addColumn('project_member', new TableColumn({ name: 'role', type: 'varchar', length: '20', isNullable: true }));
    const builder = () => queryRunner.manager.createQueryBuilder();
    for (const role of PROJECT_ROLES_THEN) {
      const holders = builder().subQuery().select('u.id').from('user_account', 'u').where('u.role = :role').getQuery();
      await builder().update('project_member').set({ role }).where(`role IS NULL AND user_id IN ${holders}`, { role }).execute();
    }
    await builder().update('user_account').set({ role: 'member' }).where('role IN (:...roles)', { roles: [...PROJECT_ROLES_THEN] }).execute();
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    // The account takes back one project role: the one of its earliest membership that has one.
    const memberships: { user_id: number; role: string }[] = await queryRunner.manager
      .createQueryBuilder()
      .select(['m.user_id AS user_id', 'm.role AS role'])
      .from('project_member', 'm')
      .where('m.role IS NOT NULL')
      .orderBy('m.id', 'ASC')
      .getRawMany();
    const first = new Map<number, string>();
    for (const m of memberships) if (!first.has(Number(m.user_id))) first.set(Number(m.user_id), m.role);
    for (const [userId, role] of first) {
      await queryRunner.manager.createQueryBuilder().update('user_account').set({ role }).where('id = :userId AND role = :member', { userId, member: 'member' }).execute();
    }
    await queryRunner.dropColumn('project_member', 'role');
  }
}
