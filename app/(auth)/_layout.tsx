import { Slot } from 'expo-router';

// Sign-in and sign-up stand alone, without the navigation of the signed-in areas.
export default function AuthLayout() {
  return <Slot />;
}
