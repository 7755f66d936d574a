"use client";

// Form pieces shared by every form. The field set lives in components/form/fields.tsx and the
// fetch wrapper in lib/api/client.ts; the names below stay for the screens that import them here.
import type { FieldValues, UseFormReturn } from "react-hook-form";
import { ApiFailure, placeFailure, type ErrorBody } from "@/lib/api/client";
import { useApiMutation } from "@/lib/api/mutations";

export { FieldError, FormAlert } from "./form/fields";
export { sendJson, type JsonResult } from "@/lib/api/client";

/** Puts a route's 422 issues on the form's fields; returns the message for the rest. */
export function applyIssues<F extends FieldValues>(form: UseFormReturn<F, any, any>, body: ErrorBody | null | undefined) {
  const status = body?.issues?.length ? 422 : 400;
  return placeFailure(form, new ApiFailure(status, { ...(body ?? {}), error: body?.error ?? "Not saved." })).message;
}

/** A button that DELETEs (or sends `method` with `body`) and refreshes the page; shows the error. */
export function ActionButton({
  url,
  method = "DELETE",
  body,
  confirm,
  label,
  className = "btn-quiet",
  done,
}: {
  url: string;
  method?: string;
  body?: unknown;
  confirm?: string;
  label: React.ReactNode;
  className?: string;
  done?: string;
}) {
  const act = useApiMutation<void>({ request: () => ({ url, method, body }), refresh: true });
  return (
    <span className="inline-flex flex-col items-start">
      <button
        type="button"
        className={className}
        disabled={act.isPending}
        onClick={() => {
          if (confirm && !window.confirm(confirm)) return;
          void act.submit();
        }}
      >
        {label}
      </button>
      {act.errorText && (
        <span role="alert" className="mt-1 text-xs font-semibold text-block">
          ✖ {act.errorText}
        </span>
      )}
      {act.isSuccess && done && (
        <span role="status" className="mt-1 text-xs font-semibold text-clear">
          ✓ {done}
        </span>
      )}
    </span>
  );
}
