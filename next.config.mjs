/** @type {import('next').NextConfig} */
const nextConfig = {
  // forbidden() / unauthorized() render app/forbidden.tsx with a real 403 status.
  experimental: { authInterrupts: true },
  serverExternalPackages: ["@node-rs/argon2", "pg"],
  poweredByHeader: false,
  typedRoutes: false,
};

export default nextConfig;
