import { AppText } from '@/components/ui/text';
import type { UploadFile } from '@/hooks/upload';

/** Native apps will pick photos with the system picker (not wired yet); adding photos works on the web. */
export function PhotoFileInput(_props: { label: string; onFile: (file: UploadFile) => void; disabled?: boolean }) {
  return <AppText variant="caption">Adding photos works in the web app for now.</AppText>;
}
