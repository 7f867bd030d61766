export declare const NEVER_ARCHIVED: string[];
export declare function isSecretEntry(name: string): boolean;
export declare function withoutSecrets(gzippedTar: Uint8Array): Promise<Buffer>;
export declare function entryNames(gzippedTar: Uint8Array): Promise<string[]>;
