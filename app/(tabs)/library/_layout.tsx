import { Stack } from 'expo-router';

export default function LibraryLayout() {
  return <Stack screenOptions={{ headerShown: false }} />;
}
