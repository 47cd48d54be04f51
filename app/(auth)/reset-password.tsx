import { ResetPasswordScreen } from '@/screens/auth/reset-password';

export default function ResetPasswordRoute() {
  return <ResetPasswordScreen />;
}
