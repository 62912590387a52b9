// The tool's version as records and exports name it; test/report/test-record.test.ts keeps it equal to package.json.
export const TOOL_NAME = 'Interlock Algebra';
export const TOOL_VERSION = '0.1.0';
