import { SignUpScreen } from '@/screens/auth/sign-up';

export default function SignUpRoute() {
  return <SignUpScreen />;
}
