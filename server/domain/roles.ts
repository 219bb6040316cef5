/** The roles a person can hold in a studio (see policy.ts for what each may do). */
export const ROLES = ['owner', 'coordinator', 'grader', 'tester'] as const;
export type Role = (typeof ROLES)[number];

/** Roles an invitation can carry; a studio gets another owner by a role change, not a link. */
export const INVITABLE_ROLES = ['coordinator', 'grader', 'tester'] as const;
export type InvitableRole = (typeof INVITABLE_ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  coordinator: 'Coordinator',
  grader: 'Grader',
  tester: 'Tester',
};

/** Roles that work inside the studio, as opposed to volunteer testers. */
export const STAFF_ROLES: readonly Role[] = ['owner', 'coordinator', 'grader'];
