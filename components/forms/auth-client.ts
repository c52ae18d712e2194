import type { signIn as SignIn, signOut as SignOut } from "next-auth/react";

/**
 * next-auth's browser calls, loaded when they are used rather than with the page: every page
 * carries the account menu and the sign-in pages are the smallest of the app, and the auth client
 * would be a tenth of their script.
 */
export const signIn: typeof SignIn = async (...args) => (await import("next-auth/react")).signIn(...args);
export const signOut: typeof SignOut = async (...args) => (await import("next-auth/react")).signOut(...args);
