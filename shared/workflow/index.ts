/** Workflow: roles, permissions and proposal states, shared by the server and the browser. */
export * from './roles';
export * from './proposal-states';
