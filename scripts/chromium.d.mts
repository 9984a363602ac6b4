export declare const CHROMIUM_LAUNCH: { executablePath: string; args: string[] };
