"use client";

import useSWR from "swr";
import { fetcher } from "./fetcher";
import type { PublicUserDto } from "./types";

export function useUsers() {
  return useSWR<{ users: PublicUserDto[] }>("/api/users", fetcher);
}
