import { SignInScreen } from '@/screens/auth/sign-in';

export default function SignInRoute() {
  return <SignInScreen />;
}
