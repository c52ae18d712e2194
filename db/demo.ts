/**
 * The demo scenario's names and sign-ins. Everything here is invented: the shop, its people, its
 * clients and their jobs. Plain data, so the scripts can print the sign-ins without loading the app.
 */
export const DEMO_PASSWORD = "chalkline-demo";

export const DEMO_ACCOUNTS = [
  { email: "owner@chalkline.test", name: "Maren Holt", role: "owner" },
  { email: "designer@chalkline.test", name: "Theo Okonkwo", role: "designer" },
  { email: "press@chalkline.test", name: "Sam Lindqvist", role: "production" },
  { email: "client@chalkline.test", name: "Priya Castell", role: "client" },
] as const;

export const DEMO_SHOP = { slug: "quarry-street-print-co", name: "Quarry Street Print Co." };
