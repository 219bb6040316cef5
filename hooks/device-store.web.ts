/**
 * Small records kept in this browser (unsaved form changes) so a reload, a lost connection or a
 * closed tab loses nothing. localStorage is synchronous, so a keystroke is on the device before
 * the page can go away. A browser that refuses storage (private mode, full quota) still works:
 * the record then lives as long as the page.
 */
const fallback = new Map<string, string>();

function storage(): Storage | null {
  try {
    return typeof window !== 'undefined' && window.localStorage ? window.localStorage : null;
  } catch {
    return null;
  }
}

export const deviceStore = {
  read<T>(key: string): T | null {
    let text: string | null | undefined;
    try {
      text = storage()?.getItem(key);
    } catch {
      text = null;
    }
    text ??= fallback.get(key) ?? null;
    if (text === null) return null;
    try {
      return JSON.parse(text) as T;
    } catch {
      return null;
    }
  },
  write(key: string, value: unknown): void {
    const text = JSON.stringify(value);
    fallback.set(key, text);
    try {
      storage()?.setItem(key, text);
    } catch {
      // Quota or privacy mode: the in-page copy above still holds it while the page lives.
    }
  },
  remove(key: string): void {
    fallback.delete(key);
    try {
      storage()?.removeItem(key);
    } catch {
      // Nothing to do: the in-page copy is gone.
    }
  },
};
