import { SignUpForm } from "./SignUpForm";

export const metadata = { title: "Start a shop" };

export default function SignUpPage() {
  return <SignUpForm />;
}
