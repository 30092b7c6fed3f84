"use server";

import { cookies, headers } from "next/headers";
import { redirect } from "next/navigation";
import { getDb } from "@/db";
import { lucia } from "@/server/auth/lucia";
import { clientAddress } from "@/server/auth/rate-limit";
import { ApiError, fieldErrors } from "@/server/http/errors";
import { CROSS_SITE_MESSAGE, writeOrigin } from "@/server/http/origin";
import { createFirstOwner } from "@/server/staff/mutations";
import { firstRunSchema } from "@/server/staff/schemas";

export interface FirstRunState {
  message?: string;
  fields?: Record<string, string[]>;
  values?: Record<string, string>;
}

/** Creates the shop's first owner; refuses once any staff exist, so it cannot be used to add owners later. */
export async function createOwnerAction(_prev: FirstRunState, formData: FormData): Promise<FirstRunState> {
  // The proxy refuses cross-site server actions; checked here too, so this one never depends on it.
  if (writeOrigin(await headers()) !== "same-origin") return { message: CROSS_SITE_MESSAGE };
  const values = Object.fromEntries(["shopName", "shopPhone", "name", "email"].map((k) => [k, String(formData.get(k) ?? "")]));
  const parsed = firstRunSchema.safeParse({ ...values, password: String(formData.get("password") ?? "") });
  if (!parsed.success) return { message: "Check the fields marked below.", fields: fieldErrors(parsed.error), values };
  let id: string;
  try {
    id = await createFirstOwner(getDb(), parsed.data, clientAddress(new Request("http://first-run.local/", { headers: await headers() })));
  } catch (err) {
    if (err instanceof ApiError) return { message: err.message, values };
    throw err;
  }
  const session = await lucia.createSession(id, {});
  const cookie = lucia.createSessionCookie(session.id);
  (await cookies()).set(cookie.name, cookie.value, cookie.attributes);
  redirect("/board");
}
