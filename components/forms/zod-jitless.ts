import { config } from "zod";

// The page's CSP has no 'unsafe-eval': zod must not try to compile validators with `new Function`
// (in the browser the attempt alone is a policy violation). Imported for this one effect by the
// client code that parses in the browser (the app shell of every signed-in page, the lazily loaded
// sign-up checks), before any form parses. Pages that never parse (the review link) load no zod.
config({ jitless: true });
