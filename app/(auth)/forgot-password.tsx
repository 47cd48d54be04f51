import { ForgotPasswordScreen } from '@/screens/auth/forgot-password';

export default function ForgotPasswordRoute() {
  return <ForgotPasswordScreen />;
}
