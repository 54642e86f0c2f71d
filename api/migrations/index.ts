/** Every migration, oldest first (run on start by server.ts and by tests). */
import { InitialSchema1764612000000 } from './1764612000000-initial-schema';

export const MIGRATIONS = [InitialSchema1764612000000];
