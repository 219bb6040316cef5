import { fireEvent, screen, waitFor } from '@testing-library/react-native';
import { renderRouter } from 'expo-router/testing-library';
import { SWRConfig } from 'swr';
import type { ReactNode } from 'react';
import StudioLayout from '@/app/(studio)/_layout';
import FindingsScreen from '@/app/(studio)/findings';
import MembersScreen from '@/app/(studio)/members';
import PatternsScreen from '@/app/(studio)/patterns';
import TrialsScreen from '@/app/(studio)/trials';
import { isActive } from '@/components/layout/nav-items';
import { fetcher } from '@/hooks/api';
import { useIsWide } from '@/hooks/use-is-wide';
import type { Role } from '@/server/domain/roles';

jest.mock('@/hooks/use-is-wide', () => ({ useIsWide: jest.fn(() => false) }));
const mockedUseIsWide = jest.mocked(useIsWide);

/** Answers the session request as a member of one studio in the given role; other requests get empty lists. */
function serveSessionAs(role: Role | null) {
  global.fetch = jest.fn(async (input: RequestInfo | URL) => {
    const url = String(input);
    if (url === '/api/auth/session') {
      if (!role) return new Response(JSON.stringify({ error: { code: 'unauthenticated', message: 'Sign in first.' } }), { status: 401 });
      const studio = { id: 's1', name: 'Test Studio', slug: 'test', timeZone: 'UTC', role };
      const session = { user: { id: 'u1', email: 'me@example.test', name: 'Me' }, studios: [studio], currentStudioId: 's1' };
      return new Response(JSON.stringify(session), { status: 200 });
    }
    if (url === '/api/studios/s1') return new Response(JSON.stringify({ id: 's1', name: 'Test Studio', settings: { fullerBellyMarginMm: 25.4 } }), { status: 200 });
    return new Response('[]', { status: 200 });
  }) as jest.Mock;
}

// A fresh SWR cache for every render, so one test's session never leaks into the next.
function Fresh({ children }: { children: ReactNode }) {
  return <SWRConfig value={{ provider: () => new Map(), fetcher, dedupingInterval: 0 }}>{children}</SWRConfig>;
}

function FreshStudioLayout() {
  return (
    <Fresh>
      <StudioLayout />
    </Fresh>
  );
}

const studioRoutes = {
  '(studio)/_layout': FreshStudioLayout,
  '(studio)/trials': TrialsScreen,
  '(studio)/patterns': PatternsScreen,
  '(studio)/findings': FindingsScreen,
  '(studio)/members': MembersScreen,
  '(auth)/sign-in': () => null,
  'my-trials': () => null,
};

describe('the studio shell', () => {
  it('on a phone, shows the owner every section in the bottom navigation and moves between them', async () => {
    mockedUseIsWide.mockReturnValue(false);
    serveSessionAs('owner');
    const router = renderRouter(studioRoutes, { initialUrl: '/trials' });

    expect(await screen.findByRole('heading', { name: 'Trials' })).toBeTruthy();
    expect(screen.getByLabelText('Sections')).toBeTruthy();
    for (const label of ['Trials', 'Patterns', 'Findings', 'Members', 'Studios', 'Profile']) {
      expect(screen.getByRole('link', { name: new RegExp(label) })).toBeTruthy();
    }
    expect(screen.getByText('Test Studio · Owner')).toBeTruthy();

    fireEvent.press(screen.getByRole('link', { name: /Patterns/ }));
    expect(await screen.findByRole('heading', { name: 'Patterns' })).toBeTruthy();
    expect(router.getPathname()).toBe('/patterns');
  });

  it('gives a grader no member management, and says what a grader does: triage and notes', async () => {
    mockedUseIsWide.mockReturnValue(true);
    serveSessionAs('grader');
    renderRouter(studioRoutes, { initialUrl: '/findings' });
    await screen.findByRole('heading', { name: 'Findings' });
    expect(screen.getByText('Triage and notes')).toBeTruthy();
    expect(screen.queryByRole('link', { name: /Members/ })).toBeNull();
    expect(screen.getByRole('link', { name: /Findings/ }).props['aria-current']).toBe('page');
    expect(screen.getByRole('link', { name: /Trials/ }).props['aria-current']).toBeUndefined();
  });

  it('sends a signed-out visitor to sign-in, remembering where they were going', async () => {
    serveSessionAs(null);
    const router = renderRouter(studioRoutes, { initialUrl: '/patterns' });
    await waitFor(() => expect(router.getPathname()).toBe('/sign-in'));
    expect(router.getSearchParams()).toEqual({ next: '/patterns' });
  });

  it('sends a tester away from the studio area to their own trials', async () => {
    serveSessionAs('tester');
    const router = renderRouter(studioRoutes, { initialUrl: '/trials' });
    await waitFor(() => expect(router.getPathname()).toBe('/my-trials'));
  });
});

describe('isActive', () => {
  it('counts a section active on its own page and on pages below it, not on a look-alike prefix', () => {
    expect(isActive('/trials', '/trials')).toBe(true);
    expect(isActive('/trials/42/reports', '/trials')).toBe(true);
    expect(isActive('/trials-archive', '/trials')).toBe(false);
    expect(isActive('/patterns', '/trials')).toBe(false);
  });
});
