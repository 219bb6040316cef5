import { createContext, useContext } from 'react';

/**
 * Whether the content sits inside a `main` landmark already (the signed-in shell draws one around
 * its screens). A screen outside the shell is the page's main landmark itself, so every page has
 * exactly one, and nothing nests a second.
 */
export const InsideMain = createContext(false);

export function useInsideMain(): boolean {
  return useContext(InsideMain);
}
