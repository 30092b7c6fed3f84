import type { Metadata } from "next";
import { NotFoundBody } from "@/components/not-found-body";

export const metadata: Metadata = { title: "Not found" };

/** A job, truck or customer that is not there: shown inside the shell, so the menu is a way back. */
export default function ShopNotFound() {
  return <NotFoundBody />;
}
