import { useState } from 'react';
import { QueryClientProvider } from '@tanstack/react-query';
import { useFonts } from 'expo-font';
import { Stack } from 'expo-router';
import { StatusBar } from 'expo-status-bar';
import { SafeAreaProvider } from 'react-native-safe-area-context';

import { createQueryClient } from '@/api/query-client';
import { ServiceStatus } from '@/components/app-shell/service-status';
import { fontFiles } from '@/theme';

export default function RootLayout() {
  const [queryClient] = useState(createQueryClient);
  // Fonts ship in fonts/ and load from the bundle; on failure the system face is used rather than a blank app.
  const [fontsLoaded, fontError] = useFonts(fontFiles);
  if (!fontsLoaded && !fontError) return null;

  return (
    <SafeAreaProvider>
      <QueryClientProvider client={queryClient}>
        <StatusBar style="dark" />
        {/* Above every page, signed in or not: says plainly when the server or database is down. */}
        <ServiceStatus />
        <Stack screenOptions={{ headerShown: false }} />
      </QueryClientProvider>
    </SafeAreaProvider>
  );
}
