import { Link, Outlet, useLocation } from "react-router-dom";
import { PublicLayout } from "@/components/layouts/public-layout";
import { useMe } from "@/features/auth/api/get-me";
import { roleHome } from "@/features/auth/roles";

export default function PublicRoot() {
  const { data: user } = useMe();
  const { pathname } = useLocation();
  const wide = pathname.startsWith("/calculator");
  let action = null;
  if (user) {
    const home = roleHome(user.role);
    action = <Link to={home.path}>Back to {home.label}</Link>;
  } else if (!pathname.startsWith("/sign-in")) {
    action = <Link to="/sign-in">Sign in</Link>;
  }
  return (
    <PublicLayout headerAction={action} wide={wide}>
      <Outlet />
    </PublicLayout>
  );
}
