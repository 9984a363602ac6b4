import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";

// The root layout's BrowserZod (components/providers/browser-zod.tsx) sets zod's plain parsers for
// the CSP before any schema loads; a form sets it again here, beside zod itself, in case a form is
// ever rendered outside that layout. Forms take their resolver from here (lint refuses
// `@hookform/resolvers/zod` elsewhere).
if (typeof window !== "undefined") z.config({ jitless: true });

export { zodResolver };
