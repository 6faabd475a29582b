// zod/mini leaves out its English messages unless told to use them (zod's classic API sets them as it
// loads). Every schema module imports this first, so a check without a message of its own reads the
// same in the browser, on the server and in a script that loads the schemas alone.
import { config } from 'zod/mini';
import en from 'zod/v4/locales/en.js';

config(en());
