// JSON shapes as the client receives them (dates arrive as strings).
import type { Role } from "@/lib/auth/permissions";

export interface PublicUserDto {
  id: string;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  invited: boolean;
  createdAt: string;
}
