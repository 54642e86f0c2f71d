/** Every migration, oldest first (run on start by server.ts and by tests). */
import { InitialSchema1764612000000 } from './1764612000000-initial-schema';
import { VerificationJobs1764700000000 } from './1764700000000-verification-jobs';
import { MailOutbox1764700100000 } from './1764700100000-mail-outbox';
import { DeviceModels1764700200000 } from './1764700200000-device-models';
import { Measurements1764700300000 } from './1764700300000-measurements';
import { SpecTextAndTolerance1764800000000 } from './1764800000000-spec-text-and-tolerance';
import { DeviceModelRetirement1764800200000 } from './1764800200000-device-model-retirement';
import { AccountControls1764800300000 } from './1764800300000-account-controls';
import { ProjectMemberRoles1764800400000 } from './1764800400000-project-member-roles';
import { MailDigest1764800400100 } from './1764800400100-mail-digest';
import { DesignBinding1764800500000 } from './1764800500000-design-binding';
import { SpecLifecycle1764800600000 } from './1764800600000-spec-lifecycle';
import { DistinctRankings1764900000000 } from './1764900000000-distinct-rankings';
import { CheckMetadata1764900100000 } from './1764900100000-check-metadata';
import { WaitingAndActivityIndexes1796000000000 } from './1796000000000-waiting-and-activity-indexes';
import { SearchIndex1796100000000 } from './1796100000000-search-index';
import { PersonalApiTokens1796200000000 } from './1796200000000-personal-api-tokens';
import { ProposalComments1796300000000 } from './1796300000000-proposal-comments';
import { NoticePreferences1796400000000 } from './1796400000000-notice-preferences';

export const MIGRATIONS = [
  InitialSchema1764612000000,
  VerificationJobs1764700000000,
  MailOutbox1764700100000,
  DeviceModels1764700200000,
  Measurements1764700300000,
  SpecTextAndTolerance1764800000000,
  DeviceModelRetirement1764800200000,
  AccountControls1764800300000,
  ProjectMemberRoles1764800400000,
  MailDigest1764800400100,
  DesignBinding1764800500000,
  SpecLifecycle1764800600000,
  DistinctRankings1764900000000,
  CheckMetadata1764900100000,
  WaitingAndActivityIndexes1796000000000,
  SearchIndex1796100000000,
  PersonalApiTokens1796200000000,
  ProposalComments1796300000000,
  NoticePreferences1796400000000,
];
