import 'reflect-metadata'
import { DataSource } from 'typeorm'
import { ApiTokenEntity } from './entities/api-token.entity'
import { AuditChunkEntity } from './entities/audit-chunk.entity'
import { AuditEntity } from './entities/audit.entity'
import { MembershipEntity } from './entities/membership.entity'
import { PathEntity } from './entities/path.entity'
import { PathTagEntity } from './entities/path-tag.entity'
import { ProbeSetEntity } from './entities/probe-set.entity'
import { ProjectEntity } from './entities/project.entity'
import { RevisionEntity } from './entities/revision.entity'
import { CheckEntity } from './entities/check.entity'
import { RunEntity } from './entities/run.entity'
import { RunResultEntity } from './entities/run-result.entity'
import { SuiteEntity } from './entities/suite.entity'
import { SuiteWatcherEntity } from './entities/suite-watcher.entity'
import { TeamEntity } from './entities/team.entity'
import { UserEntity } from './entities/user.entity'
import { Initial1764633600000 } from './migrations/1764633600000-initial'
import { Library1764720000000 } from './migrations/1764720000000-library'
import { ProbeSets1764806400000 } from './migrations/1764806400000-probe-sets'
import { Tokens1764892800000 } from './migrations/1764892800000-tokens'
import { Suites1764892900000 } from './migrations/1764892900000-suites'
import { Audits1764893000000 } from './migrations/1764893000000-audits'
import { InvitationEntity } from './entities/invitation.entity'
import { Invitations1764979200000 } from './migrations/1764979200000-invitations'
import { PasswordResetEntity } from './entities/password-reset.entity'
import { PasswordResets1764979300000 } from './migrations/1764979300000-password-resets'
import { ActivityEntity } from './entities/activity.entity'
import { Activity1764979400000 } from './migrations/1764979400000-activity'

export const entities = [UserEntity, TeamEntity, MembershipEntity, ProjectEntity, PathEntity, RevisionEntity, PathTagEntity, ProbeSetEntity, ApiTokenEntity, SuiteEntity, CheckEntity, RunEntity, RunResultEntity, SuiteWatcherEntity, AuditEntity, AuditChunkEntity, InvitationEntity, PasswordResetEntity, ActivityEntity]
export const migrations = [Initial1764633600000, Library1764720000000, ProbeSets1764806400000, Tokens1764892800000, Suites1764892900000, Audits1764893000000, Invitations1764979200000, PasswordResets1764979300000, Activity1764979400000]

/** A MariaDB data source for the given URL. Schema changes come only from migrations. */
export function createDataSource(url: string): DataSource {
  return new DataSource({
    type: 'mariadb',
    url,
    charset: 'utf8mb4_unicode_ci',
    timezone: 'Z',
    entities,
    migrations,
    migrationsTransactionMode: 'each',
    synchronize: false,
    logging: ['error'],
    extra: { connectionLimit: 10 },
  })
}
