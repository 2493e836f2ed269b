/** @type {import('next').NextConfig} */
const nextConfig = {
  // forbidden() / unauthorized() render app/forbidden.tsx with a real 403 status.
  experimental: {
    authInterrupts: true,
    // The proxy buffers request bodies up to this size; datasheets may be 10 MB.
    proxyClientMaxBodySize: "12mb",
  },
  // Certificates: react-pdf (already external by Next's default list) reads its fonts from node_modules at
  // run time; the PDF signing packages share one @signpdf/utils Signer class, so they load as plain Node modules.
  serverExternalPackages: ["@node-rs/argon2", "pg", "@react-pdf/renderer", "@signpdf/signpdf", "@signpdf/signer-p12", "@signpdf/placeholder-pdf-lib", "node-forge", "pdf-lib"],
  poweredByHeader: false,
  typedRoutes: false,
};

export default nextConfig;
