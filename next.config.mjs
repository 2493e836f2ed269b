/** @type {import('next').NextConfig} */
const nextConfig = {
  // forbidden() / unauthorized() render app/forbidden.tsx with a real 403 status.
  experimental: {
    authInterrupts: true,
    // The proxy buffers request bodies up to this size; datasheets may be 10 MB.
    proxyClientMaxBodySize: "12mb",
  },
  serverExternalPackages: ["@node-rs/argon2", "pg"],
  poweredByHeader: false,
  typedRoutes: false,
};

export default nextConfig;
