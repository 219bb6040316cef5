import type Ionicons from '@expo/vector-icons/Ionicons';
import type { ComponentProps } from 'react';
import type { Href } from 'expo-router';
import type { Action } from '@/server/domain/policy';

export type NavItem = {
  href: Href & string;
  label: string;
  icon: ComponentProps<typeof Ionicons>['name'];
  /** Shown only to roles the policy allows this action. */
  action?: Action;
};

/** The studio staff's sections (owner, coordinator, grader). */
export const STUDIO_NAV: NavItem[] = [
  { href: '/trials', label: 'Trials', icon: 'clipboard-outline' },
  { href: '/patterns', label: 'Patterns', icon: 'cut-outline' },
  { href: '/findings', label: 'Findings', icon: 'analytics-outline' },
  { href: '/testers', label: 'Testers', icon: 'people-circle-outline', action: 'applicants.manage' },
  { href: '/members', label: 'Members', icon: 'people-outline', action: 'members.list' },
];

/** A volunteer tester's sections. */
export const TESTER_NAV: NavItem[] = [{ href: '/my-trials', label: 'My trials', icon: 'shirt-outline' }];

/** Everyone's own pages. */
export const ACCOUNT_NAV: NavItem[] = [
  { href: '/studios', label: 'Studios', icon: 'swap-horizontal-outline' },
  { href: '/profile', label: 'Profile', icon: 'body-outline' },
];

/** Whether a section is the current one: its own page or any page below it. */
export function isActive(pathname: string, href: string): boolean {
  return pathname === href || pathname.startsWith(`${href}/`);
}
