"use client";

import { useState } from "react";
import { FieldError } from "@/components/form/fields";
import type { WorkerOption } from "./rotation-form";

/** A rotation's members in turn order: move up and down, remove, add from this yard or others. */
export function TurnOrder({
  members,
  workers,
  yardId,
  yardName,
  onChange,
  error,
}: {
  members: number[];
  workers: WorkerOption[];
  yardId: number;
  yardName?: string;
  onChange: (ids: number[]) => void;
  error?: string;
}) {
  const [pick, setPick] = useState<number>(0);
  const byId = new Map(workers.map((w) => [w.id, w]));
  const move = (i: number, d: -1 | 1) => {
    const next = [...members];
    [next[i], next[i + d]] = [next[i + d], next[i]];
    onChange(next);
  };
  const yardWorkers = workers.filter((w) => w.yardId === yardId && !members.includes(w.id));
  const otherWorkers = workers.filter((w) => w.yardId !== yardId && !members.includes(w.id));
  return (
    <div>
      <p className="label">Turn order</p>
      <ol className="space-y-1">
        {members.map((id, i) => {
          const w = byId.get(id);
          return (
            <li key={id} className="flex items-center gap-2 rounded-md border border-rule bg-white px-2 py-1 text-sm">
              <span className="w-5 text-right font-bold tabular-nums text-ink-500">{i + 1}</span>
              <span className="flex-1 font-semibold">
                {w?.name ?? `Worker ${id}`} <span className="text-xs text-ink-500">{w?.employeeNo}</span>
              </span>
              <button type="button" className="btn-quiet px-2 py-1" disabled={i === 0} onClick={() => move(i, -1)} aria-label={`Move ${w?.name} up`}>
                ↑
              </button>
              <button type="button" className="btn-quiet px-2 py-1" disabled={i === members.length - 1} onClick={() => move(i, 1)} aria-label={`Move ${w?.name} down`}>
                ↓
              </button>
              <button type="button" className="btn-quiet px-2 py-1" onClick={() => onChange(members.filter((m) => m !== id))} aria-label={`Remove ${w?.name}`}>
                ✕
              </button>
            </li>
          );
        })}
      </ol>
      <div className="mt-2 flex flex-wrap items-center gap-2">
        <select aria-label="Worker to add" className="field w-auto" value={pick} onChange={(e) => setPick(Number(e.target.value))}>
          <option value={0}>Add a worker…</option>
          <optgroup label={yardName ?? "This yard"}>
            {yardWorkers.map((w) => (
              <option key={w.id} value={w.id}>
                {w.name} ({w.employeeNo})
              </option>
            ))}
          </optgroup>
          <optgroup label="Other yards">
            {otherWorkers.map((w) => (
              <option key={w.id} value={w.id}>
                {w.name} ({w.employeeNo}, {w.yardCode})
              </option>
            ))}
          </optgroup>
        </select>
        <button
          type="button"
          className="btn-quiet"
          disabled={!pick}
          onClick={() => {
            onChange([...members, pick]);
            setPick(0);
          }}
        >
          Add
        </button>
      </div>
      <FieldError msg={error} />
    </div>
  );
}
