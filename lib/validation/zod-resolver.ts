import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";

// In the browser, zod first tries `new Function("")` to see whether it may compile fast parsers;
// under the Content-Security-Policy (no 'unsafe-eval', proxy.ts) that try is a policy violation.
// Telling zod up front to use its plain parsers avoids the try; the server keeps the fast ones.
// Forms take their resolver from here (lint refuses `@hookform/resolvers/zod` elsewhere), so the
// setting travels with zod itself: only pages with a form load zod, and they always load it set.
if (typeof window !== "undefined") z.config({ jitless: true });

export { zodResolver };
