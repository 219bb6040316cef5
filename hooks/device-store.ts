/**
 * Small records kept on this device (unsaved form changes) so a reload, a lost connection or a
 * closed app loses nothing. The native build keeps them in memory for now; the web build keeps
 * them in localStorage (device-store.web.ts).
 */
const memory = new Map<string, string>();

export const deviceStore = {
  read<T>(key: string): T | null {
    const text = memory.get(key);
    return text === undefined ? null : (JSON.parse(text) as T);
  },
  write(key: string, value: unknown): void {
    memory.set(key, JSON.stringify(value));
  },
  remove(key: string): void {
    memory.delete(key);
  },
};
