import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  reactStrictMode: true,
  poweredByHeader: false,
  // forbidden()/unauthorized() render app/forbidden.tsx with a real 403 status.
  experimental: { authInterrupts: true },
  // Loaded from node_modules at run time (pdfkit reads its font metrics from disk; the worker runs plain files).
  serverExternalPackages: ["pdfkit", "mysql2", "nodemailer", "bcryptjs", "dicom-parser", "zod", "@asteasolutions/zod-to-openapi"],
  typescript: { ignoreBuildErrors: false },
};

export default nextConfig;
