import type { Metadata } from "next";
import { requirePageUser } from "@/app/_lib/auth";
import { CreateUserForm } from "@/components/admin/create-user-form";
import { UserRow } from "@/components/admin/user-row";
import { db } from "@/db";
import { listUsers } from "@/db/queries/users";
import { changeUser, createUser } from "./actions";

export const metadata: Metadata = { title: "Users" };

export default async function UsersPage() {
  const me = await requirePageUser("admin");
  const users = await listUsers(db());
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
      <section className="card overflow-x-auto">
        <h1 className="border-b border-slate-200 px-4 py-3 text-lg font-semibold dark:border-slate-800">Users</h1>
        <table className="w-full text-sm">
          <thead className="text-left text-xs uppercase tracking-wide text-slate-500">
            <tr>
              <th className="px-4 py-2">Name</th>
              <th className="px-4 py-2">E-mail</th>
              <th className="px-4 py-2">Role</th>
              <th className="px-4 py-2">State</th>
              <th className="px-4 py-2">New password</th>
            </tr>
          </thead>
          <tbody>
            {users.map((u) => (
              <UserRow key={u.id} user={{ id: u.id, email: u.email, name: u.display_name, role: u.role, disabled: u.disabled }} self={u.id === me.id} submit={changeUser} />
            ))}
          </tbody>
        </table>
      </section>
      <section className="card p-4">
        <h2 className="mb-3 font-semibold">Add a user</h2>
        <CreateUserForm submit={createUser} />
      </section>
    </div>
  );
}
