/** The roles a person can hold in a studio (see DEVELOPERS.md for what each may do). */
export const ROLES = ['owner', 'coordinator', 'grader', 'tester'] as const;
export type Role = (typeof ROLES)[number];
