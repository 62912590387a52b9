// Builds the Excel task pane (taskpane.html), the standalone page (standalone.html) and their
// Web Workers into dist/ (or $IA_OUT_DIR). `npm run build` for production, `npm start` to serve
// https://localhost:3000 with the office-addin-dev-certs certificates for sideloading.
// office.js and the files it loads are copied from @microsoft/office-js so that the pane is
// served from its own origin only (see README, "Excel add-in").
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { homedir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import CopyWebpackPlugin from 'copy-webpack-plugin';
import { EsbuildPlugin } from 'esbuild-loader';
import HtmlWebpackPlugin from 'html-webpack-plugin';
import webpack from 'webpack';
import type { Configuration as DevServerConfiguration } from 'webpack-dev-server';

const root = dirname(fileURLToPath(import.meta.url));
const officeDist = join(root, 'node_modules/@microsoft/office-js/dist');
const certDir = join(homedir(), '.office-addin-dev-certs');
export const DEV_PORT = 3000;

/**
 * What office.js (npm @microsoft/office-js 1.1.110) loads at run time, read from its source:
 * o15apptofilemappingtable.js (Office 2013 hosts), the host file
 * `<host>-<platform>-<version>.js` (for Excel: excel-web-16.00.js, excel-win32-16.01.js,
 * excel-mac-16.00.js, excel-ios-16.00.js ...), `<locale>/office_strings.js` for the UI language
 * with en-us as fallback, and two telemetry scripts it may pull in. Debug builds are left out.
 */
const OFFICE_FILES = [
  'office.js',
  'o15apptofilemappingtable.js',
  'excel*.js',
  '*/office_strings.js',
  'telemetry/oteljs_agave.js',
  'ariatelemetry/aria-web-telemetry.js',
];

/**
 * Page policy: everything from our own origin; workers and downloads may use blob: URLs;
 * 'wasm-unsafe-eval' lets the transform's WebAssembly kernel compile from its bytes (it allows
 * no JS eval; without it the engine falls back to plain JS).
 */
export const CSP = [
  "default-src 'self'",
  "script-src 'self' 'wasm-unsafe-eval'",
  "style-src 'self'",
  "img-src 'self' data: blob:",
  "worker-src 'self' blob:",
  "connect-src 'self'",
  "font-src 'self'",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'none'",
].join('; ');

function devCertificates(): { key: Buffer; cert: Buffer; ca: Buffer } {
  const files = { key: join(certDir, 'localhost.key'), cert: join(certDir, 'localhost.crt'), ca: join(certDir, 'ca.crt') };
  const present = () => Object.values(files).every((f) => existsSync(f));
  if (!present()) {
    console.log(`No development certificates in ${certDir}: running "npx office-addin-dev-certs install" to create them.`);
    console.log('(Trusting the new certificate authority may need administrator rights; the files are written either way.)');
    spawnSync('npx', ['office-addin-dev-certs', 'install'], { stdio: 'inherit', cwd: root });
  }
  if (!present()) {
    throw new Error(
      `Cannot serve https://localhost:${DEV_PORT}: the certificate files ${Object.values(files).join(', ')} are missing. ` +
        'Run "npx office-addin-dev-certs install" (it may ask for administrator rights), then "npm start" again.',
    );
  }
  return { key: readFileSync(files.key), cert: readFileSync(files.cert), ca: readFileSync(files.ca) };
}

export default (_env: unknown, argv: { mode?: string }): webpack.Configuration & { devServer?: DevServerConfiguration } => {
  const production = argv.mode !== 'development';
  const serving = process.env.WEBPACK_SERVE === 'true';
  const page = (name: string, title: string) =>
    new HtmlWebpackPlugin({
      filename: `${name}.html`,
      template: join(root, 'taskpane', 'page.html'),
      chunks: [name],
      scriptLoading: 'defer',
      templateParameters: { title, csp: CSP, officeJs: name === 'taskpane' },
    });
  return {
    mode: production ? 'production' : 'development',
    devtool: production ? false : 'source-map',
    target: 'web',
    entry: {
      taskpane: join(root, 'taskpane', 'taskpane.tsx'),
      standalone: join(root, 'taskpane', 'standalone.tsx'),
    },
    output: {
      path: resolve(process.env.IA_OUT_DIR ?? join(root, 'dist')),
      filename: '[name].[contenthash:8].js',
      chunkFilename: '[name].[contenthash:8].js',
      publicPath: '',
      clean: true,
    },
    resolve: {
      extensions: ['.ts', '.tsx', '.js', '.mjs'],
      // Sources import './x.js' for './x.ts' (ESM with TypeScript).
      extensionAlias: { '.js': ['.ts', '.tsx', '.js'] },
      // Our sources import SheetJS's default export, which only its CommonJS build has.
      alias: { xlsx$: join(root, 'node_modules/xlsx/xlsx.js') },
      // SheetJS mentions Node modules it only uses under Node.
      fallback: { fs: false, stream: false, crypto: false, buffer: false, process: false },
    },
    module: {
      rules: [
        {
          test: /\.tsx?$/,
          exclude: /node_modules/,
          // Our TypeScript modules run nothing when imported (the entries and workers are
          // entries): a module of a layer's index.ts whose exports are not used is left out.
          sideEffects: false,
          loader: 'esbuild-loader',
          options: { loader: 'tsx', target: 'es2020', jsx: 'automatic', jsxImportSource: 'preact' },
        },
      ],
    },
    plugins: [
      // The SheetJS parsing worker of the file host (src/hosts/parse-worker.mjs) speaks
      // node:worker_threads; in the browser a small stand-in gives it a Web Worker's messages.
      new webpack.NormalModuleReplacementPlugin(/^node:worker_threads$/, join(root, 'taskpane', 'worker-threads-shim.ts')),
      page('taskpane', 'Interlock Algebra'),
      page('standalone', 'Interlock Algebra — standalone'),
      new CopyWebpackPlugin({
        patterns: [
          { from: join(root, 'assets', '*.png'), to: 'assets/[name][ext]' },
          { from: join(root, 'taskpane', 'styles.css'), to: 'styles.css' },
          { from: join(root, 'manifest.xml'), to: 'manifest.xml' },
          ...OFFICE_FILES.map((glob) => ({
            from: glob,
            context: officeDist,
            to: 'office-js/[path][name][ext]',
            globOptions: { ignore: ['**/*.debug.js'] },
          })),
        ],
      }),
    ],
    // esbuild minifies in seconds what terser takes minutes over (SheetJS is large).
    optimization: { minimizer: [new EsbuildPlugin({ target: 'es2020' })] },
    performance: { hints: false },
    devServer: serving
      ? {
          port: DEV_PORT,
          host: 'localhost',
          server: { type: 'https', options: devCertificates() },
          headers: { 'Content-Security-Policy': CSP, 'X-Content-Type-Options': 'nosniff' },
          static: false,
          hot: false,
          liveReload: false,
          client: false,
          webSocketServer: false,
        }
      : undefined,
  };
};
