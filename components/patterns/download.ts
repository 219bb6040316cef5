import { Linking } from 'react-native';

/** Opens a same-origin download (the session cookie rides along). */
export function startDownload(path: string): void {
  void Linking.openURL(path);
}
