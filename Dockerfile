# syntax=docker/dockerfile:1
# Build: docker build --build-arg GIT_COMMIT="$(git rev-parse HEAD)" -t tectomelt:0.1.0 .
# Run:   docker run --rm -p 7070:7070 tectomelt:0.1.0      (or: docker compose up, see compose.yaml)
# Every setting is an environment variable (see README, "Configuration" and "Running it for a group").
# Stop: SIGTERM closes the port and lets requests in flight finish for TECTOMELT_SHUTDOWN_GRACE_MS
# (12 s by default), so give Docker more than that: docker run --stop-timeout 15 ...; exit status 0.
#
# Base images: exact release tags. Pin them by digest before a release with
#   bash deploy/docker/pin-base-images.sh      (needs docker or crane and access to Docker Hub)
# which resolves each tag below to its current digest and writes it as tag@sha256:...; re-run it to
# take base-image security updates. DockerfileTest requires exact tags and the script's coverage.
ARG BUILD_IMAGE=maven:3.9.9-eclipse-temurin-17
ARG RUNTIME_IMAGE=eclipse-temurin:17.0.15_6-jre-jammy

FROM ${BUILD_IMAGE} AS build
# the git commit of the source, for /v1/health and every answer's provenance (.git is not in the
# build context, see .dockerignore)
ARG GIT_COMMIT=unknown
WORKDIR /src
COPY pom.xml .
COPY service/pom.xml service/pom.xml
COPY api-spec api-spec
COPY service service
RUN --mount=type=cache,target=/root/.m2 mvn -B -q -DskipTests -Dgit.commit.id="${GIT_COMMIT}" package

FROM ${RUNTIME_IMAGE}
ARG VERSION=0.1.0
ARG GIT_COMMIT=unknown
ARG SOURCE_URL=""
LABEL org.opencontainers.image.title="tectomelt" \
      org.opencontainers.image.description="Melt estimates for tectonic settings from published models (HTTP service)" \
      org.opencontainers.image.version="${VERSION}" \
      org.opencontainers.image.revision="${GIT_COMMIT}" \
      org.opencontainers.image.source="${SOURCE_URL}" \
      org.opencontainers.image.licenses="Apache-2.0"
# a fixed numeric user and group (10001), so that secrets and volumes can be given to it by number:
# chown 10001:10001 the token file and the data directory on the host
RUN groupadd --system --gid 10001 tectomelt \
    && useradd --system --uid 10001 --gid 10001 --home-dir /app --shell /usr/sbin/nologin tectomelt \
    && apt-get update && apt-get install -y --no-install-recommends curl && rm -rf /var/lib/apt/lists/* \
    && mkdir -p /data && chown 10001:10001 /data
WORKDIR /app
COPY --from=build /src/service/target/tectomelt.jar /app/tectomelt.jar
COPY --chmod=0755 deploy/docker/entrypoint.sh /app/entrypoint.sh
# JAVA_OPTS holds the JVM defaults; a user's JAVA_TOOL_OPTIONS is added to them by the JVM, it does
# not replace them (to change a default, set JAVA_OPTS)
ENV HOST=0.0.0.0 \
    PORT=7070 \
    TECTOMELT_DATA_DIR=/data \
    JAVA_OPTS="-Xmx256m -XX:+UseSerialGC -XX:+ExitOnOutOfMemoryError"
# the embedded run database (unless TECTOMELT_DATABASE_URL names a PostgreSQL): keep it on a volume
VOLUME /data
STOPSIGNAL SIGTERM
USER 10001:10001
EXPOSE 7070
HEALTHCHECK --interval=30s --timeout=3s --start-period=10s --retries=3 \
    CMD curl -fsS "http://127.0.0.1:${PORT}/v1/health" || exit 1
ENTRYPOINT ["/app/entrypoint.sh"]
