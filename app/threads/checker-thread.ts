/**
 * Entry of a checker thread (piscina loads it and calls the default export once per task).
 * In development and tests it runs from source under tsx; the production build bundles it to
 * build/server/checker-thread.mjs (scripts/build-cli.mjs, `buildCheckerThread`).
 */
import { runCheckerTask } from "./checker-tasks";

export default runCheckerTask;
