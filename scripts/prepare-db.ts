import { resolveDatabasePath } from "../lib/db/path";
import { prepareDatabase } from "../lib/db/prepare";

await prepareDatabase(resolveDatabasePath());
