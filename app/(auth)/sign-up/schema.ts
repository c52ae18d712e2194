import { zodResolver } from "@hookform/resolvers/zod";
import "@/components/forms/zod-jitless";
import { z } from "zod";

/** The sign-up form's own checks (the server action checks again); loaded on the first submit. */
export const signUpSchema = z.object({
  shopName: z.string().trim().min(2, "Give your shop a name of at least 2 characters."),
  name: z.string().trim().min(1, "Tell us your name."),
  email: z.string().trim().email("Enter a valid e-mail address."),
  password: z.string().min(10, "Use at least 10 characters."),
});
export type SignUpValues = z.infer<typeof signUpSchema>;

export const signUpResolver = zodResolver(signUpSchema);
