import { fireEvent, screen } from '@testing-library/react-native';
import { renderRouter } from 'expo-router/testing-library';
import StudioLayout from '@/app/(studio)/_layout';
import FindingsScreen from '@/app/(studio)/findings';
import MembersScreen from '@/app/(studio)/members';
import PatternsScreen from '@/app/(studio)/patterns';
import TrialsScreen from '@/app/(studio)/trials';
import { isActive } from '@/components/layout/nav-items';
import { useIsWide } from '@/hooks/use-is-wide';

jest.mock('@/hooks/use-is-wide', () => ({ useIsWide: jest.fn(() => false) }));
const mockedUseIsWide = jest.mocked(useIsWide);

const studioRoutes = {
  '(studio)/_layout': StudioLayout,
  '(studio)/trials': TrialsScreen,
  '(studio)/patterns': PatternsScreen,
  '(studio)/findings': FindingsScreen,
  '(studio)/members': MembersScreen,
};

describe('the studio shell', () => {
  it('on a phone, shows every section in the bottom navigation and moves between them', async () => {
    mockedUseIsWide.mockReturnValue(false);
    const router = renderRouter(studioRoutes, { initialUrl: '/trials' });

    expect(await screen.findByRole('heading', { name: 'Trials' })).toBeTruthy();
    const nav = screen.getByLabelText('Studio navigation');
    expect(nav).toBeTruthy();
    for (const label of ['Trials', 'Patterns', 'Findings', 'Members']) {
      expect(screen.getAllByText(label).length).toBeGreaterThan(0);
    }

    fireEvent.press(screen.getByRole('link', { name: /Patterns/ }));
    expect(await screen.findByRole('heading', { name: 'Patterns' })).toBeTruthy();
    expect(router.getPathname()).toBe('/patterns');
  });

  it('marks the current section for assistive technology', async () => {
    mockedUseIsWide.mockReturnValue(true);
    renderRouter(studioRoutes, { initialUrl: '/findings' });
    await screen.findByRole('heading', { name: 'Findings' });
    const current = screen.getByRole('link', { name: /Findings/ });
    expect(current.props['aria-current']).toBe('page');
    expect(screen.getByRole('link', { name: /Trials/ }).props['aria-current']).toBeUndefined();
  });

  it('on a wide window, still reaches every section', async () => {
    mockedUseIsWide.mockReturnValue(true);
    const router = renderRouter(studioRoutes, { initialUrl: '/patterns' });
    await screen.findByRole('heading', { name: 'Patterns' });
    fireEvent.press(screen.getByRole('link', { name: /Members/ }));
    expect(await screen.findByRole('heading', { name: 'Members' })).toBeTruthy();
    expect(router.getPathname()).toBe('/members');
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
