/** The tool version written into every output (keep in step with package.json). */
export const TOOL_VERSION = '0.1.0';
