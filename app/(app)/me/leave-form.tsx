"use client";

// My week's time-off form is the shared one (components/leave-form.tsx), for the signed-in worker.
import { LeaveForm as SharedLeaveForm } from "@/components/leave-form";

export function LeaveForm({ workerId, yardName }: { workerId: number; yardName: string }) {
  return <SharedLeaveForm workerId={workerId} asks yardName={yardName} className="card space-y-3 p-4" />;
}
