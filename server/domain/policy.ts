import type { Role } from './roles';

/**
 * Who may do what inside a studio: the one table every studio route is checked against
 * (server/auth/guards.ts) and the app reads to hide what a role cannot use. A tester's own
 * records (profile, applications, reports) are checked by ownership in the services as well.
 */
export const POLICY = {
  'studio.read': ['owner', 'coordinator', 'grader', 'tester'],
  'studio.update': ['owner'],
  'studio.delete': ['owner'],
  'members.list': ['owner', 'coordinator'],
  'members.changeRole': ['owner'],
  'members.remove': ['owner'],
  'invitations.list': ['owner', 'coordinator'],
  // A coordinator may invite graders and testers; only the owner invites coordinators
  // (checked in the invitations service).
  'invitations.create': ['owner', 'coordinator'],
  'invitations.revoke': ['owner', 'coordinator'],
  'patterns.read': ['owner', 'coordinator', 'grader'],
  'patterns.write': ['owner', 'coordinator'],
  // Size advice for one's own body against a pattern's chart. Testers are included because the
  // chart is what a call for testers publishes; their measurements stay their own.
  'patterns.adviseSelf': ['owner', 'coordinator', 'grader', 'tester'],
  'trials.read': ['owner', 'coordinator', 'grader'],
  'trials.write': ['owner', 'coordinator'],
  // The grader and the designer decide what a finding means and leave notes on it.
  'findings.triage': ['owner', 'coordinator', 'grader'],
  // Reading a tester's "other" alteration as a kind of the vocabulary changes the findings.
  'alterations.map': ['owner', 'coordinator'],
  // Applications carry testers' measurements: only the staff who choose testers see them.
  'applicants.manage': ['owner', 'coordinator'],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof POLICY;

export function can(role: Role | null | undefined, action: Action): boolean {
  return role != null && (POLICY[action] as readonly Role[]).includes(role);
}
