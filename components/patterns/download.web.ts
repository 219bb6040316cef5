/** On the web a plain navigation to an attachment downloads it without leaving the page. */
export function startDownload(path: string): void {
  window.location.assign(path);
}
