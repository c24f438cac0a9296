import { redirect } from "next/navigation";
import { getActor } from "@/lib/auth/actor";

export default async function Home() {
  redirect((await getActor()) ? "/dashboard" : "/sign-in");
}
