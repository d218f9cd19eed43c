/**
 * The schema library compiles fast object parsers with `new Function` after probing whether
 * `Function('')` is allowed. The app's Content Security Policy forbids it (no 'unsafe-eval'), so
 * the probe was reported as a violation at every start. Its jitless setting skips both; it is read
 * when an object schema is built, so every module that builds schemas imports this first.
 */
import { z } from 'zod';

z.config({ jitless: true });
