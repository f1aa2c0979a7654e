import { IBMPlexMono_500Medium } from '@expo-google-fonts/ibm-plex-mono/500Medium';
import { IBMPlexSans_400Regular } from '@expo-google-fonts/ibm-plex-sans/400Regular';
import { IBMPlexSans_500Medium } from '@expo-google-fonts/ibm-plex-sans/500Medium';
import { IBMPlexSans_600SemiBold } from '@expo-google-fonts/ibm-plex-sans/600SemiBold';
import Ionicons from '@expo/vector-icons/Ionicons';
import { useFonts } from 'expo-font';
import { useEffect, useState } from 'react';
import { fontFaces } from '@/components/theme';

/**
 * After this long the app shows itself with fallback fonts rather than keep someone waiting
 * (common practice, no source).
 */
const FONT_PATIENCE_MS = 3000;

/** Fonts ship inside the app bundle; nothing is fetched from the internet. */
export function useFontsReady(): boolean {
  const [loaded, error] = useFonts({
    [fontFaces.sansRegular]: IBMPlexSans_400Regular,
    [fontFaces.sansMedium]: IBMPlexSans_500Medium,
    [fontFaces.sansSemiBold]: IBMPlexSans_600SemiBold,
    [fontFaces.monoMedium]: IBMPlexMono_500Medium,
    ...Ionicons.font,
  });
  const [outOfPatience, setOutOfPatience] = useState(false);

  useEffect(() => {
    const timer = setTimeout(() => setOutOfPatience(true), FONT_PATIENCE_MS);
    return () => clearTimeout(timer);
  }, []);

  return loaded || error !== null || outOfPatience;
}
