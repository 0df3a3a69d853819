import { AtkinsonHyperlegibleNext_400Regular } from '@expo-google-fonts/atkinson-hyperlegible-next/400Regular';
import { AtkinsonHyperlegibleNext_700Bold } from '@expo-google-fonts/atkinson-hyperlegible-next/700Bold';
import { IBMPlexMono_400Regular } from '@expo-google-fonts/ibm-plex-mono/400Regular';
import { IBMPlexMono_500Medium } from '@expo-google-fonts/ibm-plex-mono/500Medium';
import { QueryClientProvider } from '@tanstack/react-query';
import { useFonts } from 'expo-font';
import { Slot } from 'expo-router';
import { useState } from 'react';
import { createQueryClient } from '@/shared/ui/api/query-client';
import { SessionGate, SessionSplash } from '@/shared/ui/navigation/session-gate';
import { fontFaces } from '@/shared/ui/theme';

// Only the four faces the theme uses, each imported by its own path (not the package index).
const faces = {
  [fontFaces.sansRegular]: AtkinsonHyperlegibleNext_400Regular,
  [fontFaces.sansBold]: AtkinsonHyperlegibleNext_700Bold,
  [fontFaces.monoRegular]: IBMPlexMono_400Regular,
  [fontFaces.monoMedium]: IBMPlexMono_500Medium,
};

export default function RootLayout() {
  const [fontsLoaded, fontError] = useFonts(faces);
  const [queryClient] = useState(createQueryClient);
  return (
    <QueryClientProvider client={queryClient}>
      {fontsLoaded || fontError ? (
        <SessionGate>
          <Slot />
        </SessionGate>
      ) : (
        <SessionSplash />
      )}
    </QueryClientProvider>
  );
}
