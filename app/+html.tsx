import { ScrollViewStyleReset } from 'expo-router/html';
import type { PropsWithChildren } from 'react';

// The web document shell; runs at export time only (no DOM, no browser APIs here).
export default function Root({ children }: PropsWithChildren) {
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta httpEquiv="X-UA-Compatible" content="IE=edge" />
        <meta name="viewport" content="width=device-width, initial-scale=1, shrink-to-fit=no, viewport-fit=cover" />
        <meta name="description" content="Basted runs fit trials of sewing patterns: testers, reports and the statistics behind them." />
        <meta name="theme-color" content="#2E5E58" />
        <ScrollViewStyleReset />
        <style dangerouslySetInnerHTML={{ __html: 'body{background-color:#FAF6EF;}' }} />
      </head>
      <body>{children}</body>
    </html>
  );
}
