/** Every entity the data source knows. */
import { ApiTokenEntity } from './api-token.entity';
import { AuditEventEntity } from './audit-event.entity';
import { DecisionEntity } from './decision.entity';
import { DeviceModelEntity } from './device-model.entity';
import { MailMessageEntity } from './mail-message.entity';
import { MeasurementEntity } from './measurement.entity';
import { PasswordResetEntity } from './password-reset.entity';
import { MailOutboxEntity } from './mail-outbox.entity';
import { ProjectMemberEntity } from './project-member.entity';
import { ProjectEntity } from './project.entity';
import { ProposalEntity } from './proposal.entity';
import { ProposalCommentEntity } from './proposal-comment.entity';
import { RankingEntity } from './ranking.entity';
import { ReviewEntity } from './review.entity';
import { SessionEntity } from './session.entity';
import { SpecVersionEntity } from './spec-version.entity';
import { SpecEntity } from './spec.entity';
import { UserEntity } from './user.entity';
import { VerificationJobEntity } from './verification-job.entity';

export const ENTITIES = [
  UserEntity,
  ProjectEntity,
  ProjectMemberEntity,
  SpecEntity,
  SpecVersionEntity,
  RankingEntity,
  ProposalEntity,
  DecisionEntity,
  ReviewEntity,
  AuditEventEntity,
  SessionEntity,
  DeviceModelEntity,
  VerificationJobEntity,
  MailOutboxEntity,
  MailMessageEntity,
  MeasurementEntity,
  PasswordResetEntity,
  ApiTokenEntity,
  ProposalCommentEntity,
];
