export declare function bundle(opts?: { quiet?: boolean }): Promise<string[]>;
