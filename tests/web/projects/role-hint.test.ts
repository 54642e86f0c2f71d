import { describe, expect, test } from 'vitest';
import { roleHint } from '../../../web/src/features/projects/utils/role-hint';

describe('the Projects page lead sentence', () => {
  test('when a person holds one project role, then one "Open a project to …" sentence says what they come to do', () => {
    expect(roleHint(['designer'])).toBe('Open a project to weigh ranked tail options and decide.');
  });

  test('when a person designs in one project and reviews in another, then the sentence is said once, each task named by its role, in the app’s review words', () => {
    const hint = roleHint(['designer', 'reviewer']);
    expect(hint.match(/Open a project/g)).toHaveLength(1);
    expect(hint).toBe(
      'Open a project to weigh ranked tail options and decide where you are circuit designer; or check decided proposals against their reasons, then sign them off or send them back for rework where you are reviewer.',
    );
    expect(hint).not.toMatch(/approve|return them/);
  });

  test('when the person is an administrator only, then the sentence speaks of accounts and projects', () => {
    expect(roleHint(['admin'])).toBe('Create projects, add people to them, and manage accounts under People.');
    expect(roleHint([])).toBe('');
  });
});
