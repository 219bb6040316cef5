import type Ionicons from '@expo/vector-icons/Ionicons';
import type { ComponentProps } from 'react';
import type { Href } from 'expo-router';

export type NavItem = { href: Href & string; label: string; icon: ComponentProps<typeof Ionicons>['name'] };

/** The studio staff's sections (owner, coordinator, grader). */
export const STUDIO_NAV: NavItem[] = [
  { href: '/trials', label: 'Trials', icon: 'clipboard-outline' },
  { href: '/patterns', label: 'Patterns', icon: 'cut-outline' },
  { href: '/findings', label: 'Findings', icon: 'analytics-outline' },
  { href: '/members', label: 'Members', icon: 'people-outline' },
];

/** A volunteer tester's sections. */
export const TESTER_NAV: NavItem[] = [
  { href: '/my-trials', label: 'My trials', icon: 'shirt-outline' },
  { href: '/profile', label: 'Profile', icon: 'body-outline' },
];

/** Whether a section is the current one: its own page or any page below it. */
export function isActive(pathname: string, href: string): boolean {
  return pathname === href || pathname.startsWith(`${href}/`);
}
