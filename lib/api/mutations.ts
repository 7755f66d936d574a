"use client";

// TanStack Query mutations over apiFetch (lib/api/client.ts): the screens' one way to write.
//
//   const save = useApiMutation({
//     request: (v: Values) => ({ url: "/api/things", method: "POST", body: v }),
//     form,                    // optional: 422 / field-naming 409 issues land on its fields
//     refresh: true,           // router.refresh() after success
//     onSuccess: (data, v) => …,
//   });
//   <form onSubmit={form.handleSubmit(save.submit)}> … {save.alert} … save.isPending
//
// `submit` never throws (handleSubmit stays quiet); the failure is in `save.failure` (until the
// next run or `save.reset()`), its sentence in `save.errorText`, and `save.conflict` is true on
// a 409 (offer a reload).
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useCallback, useState } from "react";
import { ApiFailure, apiFetch, asFailure, placeFailure, type IssueTarget } from "./client";

export interface ApiRequest {
  url: string;
  method?: string;
  body?: unknown;
}

export interface UseApiMutationOptions<TVars, TData> {
  request: (vars: TVars) => ApiRequest;
  form?: IssueTarget | null;
  /** Limit the issues put on fields to these names (and their children). */
  fields?: readonly string[];
  refresh?: boolean;
  onSuccess?: (data: TData, vars: TVars) => void | Promise<void>;
  onFailure?: (failure: ApiFailure, vars: TVars) => void;
}

export function useApiMutation<TVars = void, TData = any>(opts: UseApiMutationOptions<TVars, TData>) {
  const router = useRouter();
  const [placedText, setPlacedText] = useState<string | null>(null);
  const mutation = useMutation<TData, ApiFailure, TVars>({
    mutationFn: async (vars) => {
      const r = opts.request(vars);
      try {
        return await apiFetch<TData>(r.url, { method: r.method, body: r.body });
      } catch (err) {
        throw asFailure(err);
      }
    },
    onSuccess: async (data, vars) => {
      await opts.onSuccess?.(data, vars);
      if (opts.refresh) router.refresh();
    },
    onError: (err, vars) => {
      const f = asFailure(err);
      setPlacedText(placeFailure(opts.form, f, opts.fields).message);
      opts.onFailure?.(f, vars);
    },
  });
  const { mutateAsync } = mutation;
  /** Runs the write; resolves with the data, or undefined when it failed (never throws). */
  const submit = useCallback(
    async (vars: TVars): Promise<TData | undefined> => {
      try {
        return await mutateAsync(vars);
      } catch {
        return undefined;
      }
    },
    [mutateAsync],
  );
  const failure = mutation.error ?? null;
  return {
    ...mutation,
    submit,
    /** The last run's refusal (cleared by the next run or `reset()`). */
    failure,
    /** The alert's sentence (see placeFailure). */
    errorText: failure ? (placedText ?? failure.message) : null,
    conflict: failure?.conflict ?? false,
  };
}
