import { Stack } from 'expo-router';

export default function RequirementsLayout() {
  return <Stack screenOptions={{ headerShown: false }} />;
}
