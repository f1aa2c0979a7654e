import { QueryClientProvider } from '@tanstack/react-query';
import { Slot } from 'expo-router';
import { useState } from 'react';
import { SafeAreaProvider } from 'react-native-safe-area-context';
import { AppFrame } from '@/components/ui/app-frame';
import { createQueryClient } from '@/hooks/query-client';
import { useFontsReady } from '@/hooks/use-fonts-ready';

export default function RootLayout() {
  const [queryClient] = useState(createQueryClient);
  const fontsReady = useFontsReady();
  return (
    <QueryClientProvider client={queryClient}>
      <SafeAreaProvider>
        <AppFrame ready={fontsReady}>
          <Slot />
        </AppFrame>
      </SafeAreaProvider>
    </QueryClientProvider>
  );
}
