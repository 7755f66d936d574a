import { redirect } from "next/navigation";
import { currentUser } from "@/lib/auth/session";
import { START_PAGE } from "@/lib/users/roles";

export default async function Home() {
  const user = await currentUser();
  redirect(user ? START_PAGE[user.role] : "/login");
}
