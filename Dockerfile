# Throatline container image.
#
#   docker build -t throatline .
#   docker run --rm -p 3000:3000 --read-only --tmpfs /tmp --cap-drop ALL \
#     --security-opt no-new-privileges throatline
#
# Three stages on the same base: production dependencies, the TypeScript build, and the
# runtime image that holds only package.json, the production node_modules (the bundle leaves
# two packages outside: the PDF browser driver and the docs page's static files) and dist/. The
# service writes nothing to disk, so it runs on a read-only root filesystem as the unprivileged
# user `node`.

# ---- production dependencies only
FROM node:24-slim AS deps
WORKDIR /app
COPY package.json package-lock.json ./
RUN npm ci --omit=dev --no-audit --no-fund && npm cache clean --force

# ---- build: all dependencies, compile src/ to dist/ and bundle the service into one file,
# dist/throatline.js (src/bin/bundle.ts), which the runtime starts
FROM node:24-slim AS build
WORKDIR /app
COPY package.json package-lock.json ./
RUN npm ci --no-audit --no-fund
COPY tsconfig.json tsconfig.build.json ./
COPY src ./src
RUN npm run build

# ---- runtime
FROM node:24-slim AS runtime
ENV HOST=0.0.0.0 PORT=3000 NODE_ENV=production
# The runtime needs node alone: without npm, npx and corepack the image is smaller and holds
# no package manager for an intruder to use.
RUN rm -rf /usr/local/lib/node_modules/npm /usr/local/lib/node_modules/corepack \
    /usr/local/bin/npm /usr/local/bin/npx /usr/local/bin/corepack /opt/yarn* /usr/local/bin/yarn /usr/local/bin/yarnpkg
WORKDIR /app
# Owned by root and read-only to the service's user: the service cannot change its own code.
COPY package.json ./
COPY --from=deps /app/node_modules ./node_modules
COPY --from=build /app/dist ./dist
# The image's unprivileged `node` user, by number, so that an orchestrator can verify
# runAsNonRoot without a user database.
USER 1000:1000
EXPOSE 3000
# On SIGTERM the service turns unready, drains for DRAIN_DELAY_MS, then finishes in-flight
# requests (see the README); `docker stop -t` should allow DRAIN_DELAY_MS + SHUTDOWN_TIMEOUT_MS.
STOPSIGNAL SIGTERM
# No curl in the slim image: node itself asks /healthz.
HEALTHCHECK --interval=30s --timeout=5s --start-period=10s --retries=3 \
  CMD ["node", "-e", "fetch('http://127.0.0.1:' + (process.env.PORT || 3000) + '/healthz').then((r) => process.exit(r.ok ? 0 : 1), () => process.exit(1))"]
CMD ["node", "dist/throatline.js"]
