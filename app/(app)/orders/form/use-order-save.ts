"use client";

// The order form's writes: create, save, save a series, cancel an order, end a series — each a
// useApiMutation (lib/api/mutations.ts), so 422 issues land on the form's fields.
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useApiMutation } from "@/lib/api/mutations";
import type { OrderSeat } from "@/lib/orders/model";
import type { Mode, OrderFormApi, OrderFormShape, Row } from "./shared";

export type Alert = { tone: "block" | "clear" | "warn"; text: string } | null;

interface Saved {
  id: number;
  created: number;
  version: number;
  seats: OrderSeat[];
  timeRecords: unknown[];
  removed: number;
  kept: { number: string; workDate: string }[];
}

export function useOrderSave({
  form,
  mode,
  orderId,
  seriesId,
  version,
  setRows,
}: {
  form: OrderFormApi;
  mode: Mode;
  orderId?: number;
  seriesId?: number;
  version?: number;
  setRows: (rows: Row[]) => void;
}) {
  const router = useRouter();
  const [notice, setNotice] = useState<Alert>(null);
  const save = useApiMutation<OrderFormShape, Saved>({
    form,
    request: (values) =>
      mode === "new"
        ? { url: "/api/orders", method: "POST", body: values }
        : mode === "edit"
          ? { url: `/api/orders/${orderId}`, method: "PATCH", body: values }
          : { url: `/api/order-series/${seriesId}`, method: "PATCH", body: values },
    onSuccess: (r, values) => {
      if (mode === "new") {
        router.push(`/orders/${r.id}?created=${r.created}`);
        router.refresh();
        return;
      }
      if (mode === "edit") {
        const rows = r.seats.map((s) => ({ id: s.id, position: s.position }));
        form.reset({ ...values, version: r.version, positions: rows });
        setRows(rows);
        setNotice({ tone: "clear", text: `Saved. ${r.timeRecords.length ? `Time recorded for ${r.timeRecords.length} crew member(s). ` : ""}Open boards re-check at once.` });
      } else {
        form.reset({ ...values, version: (values.version ?? 0) + 1 });
        setNotice({
          tone: r.kept.length ? "warn" : "clear",
          text:
            `Series saved: ${r.removed} future order(s) replaced, ${r.created} made.` +
            (r.kept.length ? ` Kept as they were (staffed or edited on their own): ${r.kept.map((k) => `${k.number} on ${k.workDate}`).join(", ")}. Review them.` : ""),
        });
      }
      router.refresh();
    },
  });
  const cancel = useApiMutation<void, unknown>({
    request: () => ({ url: `/api/orders/${orderId}?version=${version}`, method: "DELETE" }),
    refresh: true,
    onSuccess: () => setNotice({ tone: "clear", text: "Order cancelled." }),
  });
  const end = useApiMutation<void, { removed: number; kept: { number: string }[] }>({
    request: () => ({ url: `/api/order-series/${seriesId}`, method: "DELETE" }),
    refresh: true,
    onSuccess: (r) =>
      setNotice({ tone: "clear", text: `Series ended: ${r.removed} future order(s) removed${r.kept.length ? `; kept ${r.kept.map((k) => k.number).join(", ")}` : ""}.` }),
  });

  const failed = save.failure ?? cancel.failure ?? end.failure;
  const alert: Alert = failed ? { tone: "block", text: failed.message } : notice;
  return {
    alert,
    /** A stale save (409): the alert offers a reload. */
    conflict: Boolean(save.failure?.conflict && mode !== "new"),
    submit: (values: OrderFormShape) => {
      setNotice(null);
      cancel.reset();
      end.reset();
      return save.submit(values);
    },
    cancelOrder: () => {
      if (!orderId || !window.confirm("Cancel this work order? It stays on record as cancelled.")) return;
      setNotice(null);
      save.reset();
      end.reset();
      void cancel.submit();
    },
    endSeries: () => {
      if (!seriesId || !window.confirm("End this series? Future orders nobody is on are removed; staffed ones stay.")) return;
      setNotice(null);
      save.reset();
      cancel.reset();
      void end.submit();
    },
  };
}
