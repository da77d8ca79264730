export const CLI_BUNDLE: string;
export function buildCli(outfile?: string): Promise<string>;
