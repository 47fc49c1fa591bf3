import os from "node:os";
import path from "node:path";

/** Where multer writes uploads, under its own random names; files are removed once processed. */
export const uploadTmpDir = path.join(os.tmpdir(), "dewline-uploads");
