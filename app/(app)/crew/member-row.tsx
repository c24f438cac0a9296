"use client";

import { useActionState } from "react";
import { FormMessage } from "@/components/ui/form-message";
import { idle } from "@/lib/actions/form-state";
import { changeRoleAction, removeMemberAction } from "./actions";

export interface MemberRowProps {
  crewId: number;
  member: { userId: number; name: string; email: string; role: string };
  editable: boolean;
  isSelf: boolean;
}

export function MemberRow({ crewId, member, editable, isSelf }: MemberRowProps) {
  const [roleState, roleAction] = useActionState(changeRoleAction, idle);
  const [removeState, removeAction] = useActionState(removeMemberAction, idle);
  const state = removeState.status !== "idle" ? removeState : roleState;
  return (
    <li className="flex flex-col gap-2 px-4 py-3 sm:flex-row sm:items-center sm:justify-between">
      <div className="min-w-0">
        <p className="font-medium">
          {member.name} {isSelf && <span className="text-sm text-ink-soft">(you)</span>}
        </p>
        <p className="truncate text-sm text-ink-soft">{member.email}</p>
      </div>
      {editable ? (
        <div className="flex flex-wrap items-center gap-2">
          <form action={roleAction} className="flex items-center gap-2">
            <input type="hidden" name="crewId" value={crewId} />
            <input type="hidden" name="userId" value={member.userId} />
            <label className="sr-only" htmlFor={`role-${member.userId}`}>
              Role of {member.name}
            </label>
            <select id={`role-${member.userId}`} name="role" defaultValue={member.role} className="field-input w-auto">
              <option value="lead">lead</option>
              <option value="pilot">pilot</option>
              <option value="observer">observer</option>
            </select>
            <button type="submit" className="btn-quiet">
              Change
            </button>
          </form>
          <form
            action={removeAction}
            onSubmit={(e) => {
              if (!confirm(`Remove ${member.name} from the crew?`)) e.preventDefault();
            }}
          >
            <input type="hidden" name="crewId" value={crewId} />
            <input type="hidden" name="userId" value={member.userId} />
            <button type="submit" className="btn-danger">
              Remove
            </button>
          </form>
        </div>
      ) : (
        <span className="rounded-full bg-tide-100 px-3 py-1 text-sm font-medium text-tide-900">{member.role}</span>
      )}
      {state.message && (
        <div className="sm:basis-full">
          <FormMessage state={state} />
        </div>
      )}
    </li>
  );
}
