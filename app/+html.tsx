import { ScrollViewStyleReset } from 'expo-router/html';
import type { PropsWithChildren } from 'react';
import { palette } from '@/shared/ui/theme/colors';

/**
 * The web document for static rendering. With `"output": "single"` (app.json) the export uses
 * Expo's index.html template instead, so the screens also set the title at run time.
 */
export default function Root({ children }: PropsWithChildren) {
  return (
    <html lang="en">
      <head>
        <meta charSet="utf-8" />
        <meta httpEquiv="X-UA-Compatible" content="IE=edge" />
        <meta name="viewport" content="width=device-width, initial-scale=1, shrink-to-fit=no" />
        <meta name="theme-color" content={palette.paper} />
        <meta
          name="description"
          content="Plumbline: method verification of FRF processing for vibration test labs."
        />
        <title>Plumbline — FRF method verification</title>
        <ScrollViewStyleReset />
        <style dangerouslySetInnerHTML={{ __html: `html, body { background-color: ${palette.paper}; color: ${palette.ink}; }` }} />
      </head>
      <body>{children}</body>
    </html>
  );
}
