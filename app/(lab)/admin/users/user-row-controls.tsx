"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { ROLE_LABELS, ROLES, type Role } from "@/lib/auth/permissions";
import { initialActionState } from "@/lib/forms/action-state";
import { changeRoleAction, setActiveAction } from "./actions";
import { Select } from "@/components/ui/select-field";

export function UserRowControls({ userId, name, role, active, isSelf }: { userId: string; name: string; role: Role; active: boolean; isSelf: boolean }) {
  const [roleState, roleAction, rolePending] = useActionState(changeRoleAction, initialActionState);
  const [activeState, activeAction, activePending] = useActionState(setActiveAction, initialActionState);
  const message = activeState.message ?? roleState.message;
  const failed = (activeState.message && !activeState.ok) || (roleState.message && !roleState.ok);
  return (
    <div className="flex flex-col gap-1">
      <div className="flex flex-wrap items-center gap-2">
        <form action={roleAction} className="flex items-center gap-1">
          <input type="hidden" name="userId" value={userId} />
          <label className="sr-only" htmlFor={`role-${userId}`}>
            Role of {name}
          </label>
          <Select id={`role-${userId}`} name="role" defaultValue={role} className="text-sm" options={ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }))} />
          <Button type="submit" variant="secondary" disabled={rolePending} aria-label={`Save role of ${name}`}>
            Save role
          </Button>
        </form>
        {!isSelf && (
          <form action={activeAction}>
            <input type="hidden" name="userId" value={userId} />
            <input type="hidden" name="active" value={active ? "false" : "true"} />
            <Button type="submit" variant={active ? "danger" : "secondary"} disabled={activePending}>
              {active ? `Deactivate ${name}` : `Reactivate ${name}`}
            </Button>
          </form>
        )}
      </div>
      {message && (
        <p role={failed ? "alert" : "status"} className={failed ? "text-sm text-deviates" : "text-sm text-meets"}>
          {message}
        </p>
      )}
    </div>
  );
}
