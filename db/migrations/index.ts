import type { MigrationFn } from 'umzug';
import type { QueryInterface } from 'sequelize';
import * as accounts from './0001-accounts';
import * as profiles from './0002-profiles-and-invitations';
import * as patterns from './0003-patterns';
import * as trials from './0004-trials';
import * as drafts from './0005-drafts';
import * as photos from './0006-photos';
import * as reports from './0007-reports';
import * as findings from './0008-findings';
import * as mailOutbox from './0009-mail-outbox';
import * as reportSaves from './0011-report-saves';
import * as sessions from './0015-sessions-and-verified-addresses';
import * as rateLimits from './0016-rate-limits';
import * as objectDeletions from './0017-object-deletions';
import * as patternChildrensWear from './0020-pattern-childrens-wear';
import * as releaseAndCommunity from './0021-release-and-community';
import * as findingsRevision from './0030-findings-revision';
import * as readIndexes from './0031-read-indexes';

export type Migration = { name: string; up: MigrationFn<QueryInterface>; down: MigrationFn<QueryInterface> };

// Listed by hand, in order, so tsx, jest and compiled code all find the same set.
export const migrations: Migration[] = [
  { name: '0001-accounts', ...accounts },
  { name: '0002-profiles-and-invitations', ...profiles },
  { name: '0003-patterns', ...patterns },
  { name: '0004-trials', ...trials },
  { name: '0005-drafts', ...drafts },
  { name: '0006-photos', ...photos },
  { name: '0007-reports', ...reports },
  { name: '0008-findings', ...findings },
  { name: '0009-mail-outbox', ...mailOutbox },
  { name: '0011-report-saves', ...reportSaves },
  { name: '0015-sessions-and-verified-addresses', ...sessions },
  { name: '0016-rate-limits', ...rateLimits },
  { name: '0017-object-deletions', ...objectDeletions },
  // Numbered 0020: 0010–0019 are kept for changes made alongside on other branches.
  { name: '0020-pattern-childrens-wear', ...patternChildrensWear },
  { name: '0021-release-and-community', ...releaseAndCommunity },
  // 0030–0034: performance (the findings revision, read indexes).
  { name: '0030-findings-revision', ...findingsRevision },
  { name: '0031-read-indexes', ...readIndexes },
];
