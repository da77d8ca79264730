export const CLI_BUNDLE: string;
export function buildCli(outfile?: string): Promise<string>;
export const CHECKER_THREAD_BUNDLE: string;
export function buildCheckerThread(outfile?: string): Promise<string>;
