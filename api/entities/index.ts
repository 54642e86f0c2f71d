/** Every entity the data source knows. */
import { AuditEventEntity } from './audit-event.entity';
import { DecisionEntity } from './decision.entity';
import { ProjectMemberEntity } from './project-member.entity';
import { ProjectEntity } from './project.entity';
import { ProposalEntity } from './proposal.entity';
import { ReviewEntity } from './review.entity';
import { SessionEntity } from './session.entity';
import { SpecVersionEntity } from './spec-version.entity';
import { SpecEntity } from './spec.entity';
import { UserEntity } from './user.entity';

export const ENTITIES = [
  UserEntity,
  ProjectEntity,
  ProjectMemberEntity,
  SpecEntity,
  SpecVersionEntity,
  ProposalEntity,
  DecisionEntity,
  ReviewEntity,
  AuditEventEntity,
  SessionEntity,
];
