"use client";
import dynamic from "next/dynamic";
import { Fragment, useCallback, useEffect, useRef, useState, useTransition } from "react";
import { useForm, type Resolver } from "react-hook-form";
import { FormMessage } from "@/components/ui/field";
import { optionId } from "@/lib/quoting/option-id";
import { EMPTY_REQUEST_FORM, readRequestForm, type RequestFormField, type RequestFormOutput, type RequestFormValues } from "@/lib/validation/request-form";
import { exploreArrangements, type ExploreResult } from "../actions";
import { OptionFilters } from "./option-filters";
import { RequestForm } from "./request-form";
import { clearSavedRequest, loadSavedRequest, saveRequest, type UploadedFile } from "./saved-request";
import type { Viewer } from "./viewer";

/** how values are typed, shown in the form's introduction (in the text face: no second font before the form is usable) */
const UNIT_EXAMPLES = ["48 V", "20 kJ", "470 µF", "5 kW", "30 s", "25 kg", "12 L"];

// The results (table, diagram, charts) are needed only after a search: they load then, so the
// storefront's first load carries the form alone. A search starts fetching them at once.
const loadResults = () => import("./arrangement-results").then((m) => m.ArrangementResults);
const ArrangementResults = dynamic(loadResults, {
  loading: () => <div className="h-96 animate-pulse rounded-lg bg-white ring-1 ring-ink-100" aria-hidden="true" />,
});

// The form's checks (zod and its schema) load on the first check, a field left or the form sent,
// not with the page: a phone shows the form and takes typing before any of it has arrived.
const resolver: Resolver<RequestFormValues, unknown, RequestFormOutput> = async (values, context, options) => {
  const { requestFormResolver } = await import("./request-form-resolver");
  return requestFormResolver(values, context, options);
};

/**
 * The storefront's request → arrangements journey. What is entered is kept in sessionStorage, so
 * it survives sign-in and sign-up; `resume` (back from signing in) re-runs the search with the
 * chosen option in focus.
 */
export function StorefrontJourney({ slug, shopName, viewer, resume }: { slug: string; shopName: string; viewer: Viewer; resume: boolean }) {
  const form = useForm<RequestFormValues, unknown, RequestFormOutput>({
    resolver,
    defaultValues: EMPTY_REQUEST_FORM,
    mode: "onTouched",
  });
  const [attachments, setAttachments] = useState<UploadedFile[]>([]);
  const [result, setResult] = useState<ExploreResult | null>(null);
  const [focus, setFocus] = useState<string | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const [searching, startSearch] = useTransition();
  const restored = useRef(false);
  const resultsRef = useRef<HTMLDivElement>(null);
  const focusRef = useRef<string | null>(null);
  focusRef.current = focus;
  const attachmentsRef = useRef<UploadedFile[]>(attachments);
  attachmentsRef.current = attachments;

  const persist = useCallback(
    (over: { focus?: string | null; attachments?: UploadedFile[] } = {}) => {
      saveRequest(slug, {
        values: form.getValues(),
        attachments: over.attachments ?? attachmentsRef.current,
        focus: over.focus === undefined ? focusRef.current : over.focus,
      });
    },
    [slug, form],
  );

  const search = useCallback(
    (values: RequestFormValues, wantFocus: string | null) => {
      setMessage(null);
      void loadResults();
      startSearch(async () => {
        let r: Awaited<ReturnType<typeof exploreArrangements>>;
        try {
          r = await exploreArrangements(slug, values);
        } catch {
          // a dropped connection or a server fault: say so here and keep the form as typed
          setMessage("The shop could not be reached, so no arrangements were found; what you typed is kept. Try again in a moment.");
          return;
        }
        if (!r.ok) {
          for (const [field, messages] of Object.entries(r.fieldErrors ?? {})) {
            const name = field.split(".")[0] as RequestFormField;
            if (name in EMPTY_REQUEST_FORM) form.setError(name, { message: messages[0] });
          }
          setMessage(r.message ?? "The search failed; try again.");
          return;
        }
        setResult(r.data);
        const ids = r.data.options.map(optionId);
        const next = wantFocus && ids.includes(wantFocus) ? wantFocus : (ids[0] ?? null);
        setFocus(next);
        saveRequest(slug, { values, attachments: attachmentsRef.current, focus: next });
        requestAnimationFrame(() => resultsRef.current?.scrollIntoView({ behavior: "smooth", block: "start" }));
      });
    },
    [slug, form],
  );

  // Restore once on arrival; back from signing in, run the saved search again.
  useEffect(() => {
    if (restored.current) return;
    restored.current = true;
    const saved = loadSavedRequest(slug);
    if (!saved) return;
    form.reset(saved.values);
    setAttachments(saved.attachments);
    attachmentsRef.current = saved.attachments;
    if (resume) {
      // the server checks the fields again; a request that no longer reads is not searched
      if (readRequestForm(saved.values).ok) search(saved.values, saved.focus);
      window.history.replaceState(null, "", `/s/${slug}`);
    }
  }, [slug, resume, form, search]);

  // Keep what is typed.
  useEffect(() => {
    const sub = form.watch(() => persist());
    return () => sub.unsubscribe();
  }, [form, persist]);

  const onSubmit = form.handleSubmit(() => search(form.getValues(), focusRef.current));
  const applyFilters = () => void form.handleSubmit(() => search(form.getValues(), focusRef.current))();

  return (
    <div className="space-y-10">
      <section aria-labelledby="describe" className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-100 sm:p-6">
        <h2 id="describe" className="text-xl font-semibold">
          Describe your bank
        </h2>
        <p className="mt-1 max-w-3xl text-sm text-ink-600">
          Say what the bank must do and compare the arrangements {shopName} can build from its stock, with their figures, cautions and prices. Exploring needs
          no account; choosing an arrangement asks you to sign in. Type values with their units:{" "}
          {UNIT_EXAMPLES.map((example, i) => (
            <Fragment key={example}>
              {i > 0 ? ", " : null}
              <kbd className="rounded bg-ink-100 px-1 font-sans whitespace-nowrap text-ink-800">{example}</kbd>
            </Fragment>
          ))}
          .
        </p>
        <RequestForm
          form={form}
          slug={slug}
          viewer={viewer}
          attachments={attachments}
          onAttachmentsChange={(next) => {
            setAttachments(next);
            persist({ attachments: next });
          }}
          onSubmit={onSubmit}
          searching={searching}
          onClear={() => {
            form.reset(EMPTY_REQUEST_FORM);
            setAttachments([]);
            setResult(null);
            setFocus(null);
            clearSavedRequest(slug);
          }}
        />
        <div className="mt-4">
          <FormMessage>{message}</FormMessage>
        </div>
      </section>
      <div ref={resultsRef} className="scroll-mt-4 space-y-4">
        {result ? <OptionFilters form={form} onApply={applyFilters} searching={searching} /> : null}
        {result ? (
          <ArrangementResults
            slug={slug}
            viewer={viewer}
            result={result}
            focus={focus}
            attachmentIds={attachments.map((a) => a.id)}
            onFocus={(id) => {
              setFocus(id);
              persist({ focus: id });
            }}
            onBeforeSignIn={(id) => persist({ focus: id })}
            onQuoted={() => clearSavedRequest(slug)}
          />
        ) : null}
      </div>
    </div>
  );
}
