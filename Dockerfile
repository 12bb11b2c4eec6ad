# syntax=docker/dockerfile:1
# Build: docker build -t tectomelt .
# Run:   docker run --rm -p 7070:7070 tectomelt
# Every setting is an environment variable (see README, "Configuration" and "Running it for a group").
# Stop: SIGTERM closes the port and lets requests in flight finish for TECTOMELT_SHUTDOWN_GRACE_MS
# (12 s by default), so give Docker more than that: docker run --stop-timeout 15 ...

FROM maven:3.9-eclipse-temurin-17 AS build
WORKDIR /src
COPY pom.xml .
COPY service/pom.xml service/pom.xml
COPY api-spec api-spec
RUN mvn -B -q -pl service -am dependency:go-offline || true
COPY service service
RUN mvn -B -q -DskipTests package

FROM eclipse-temurin:17-jre
RUN groupadd --system tectomelt && useradd --system --gid tectomelt --home-dir /app --shell /usr/sbin/nologin tectomelt \
    && apt-get update && apt-get install -y --no-install-recommends curl && rm -rf /var/lib/apt/lists/* \
    && mkdir -p /data && chown tectomelt:tectomelt /data
WORKDIR /app
COPY --from=build /src/service/target/tectomelt.jar /app/tectomelt.jar
ENV HOST=0.0.0.0 \
    PORT=7070 \
    TECTOMELT_DATA_DIR=/data \
    JAVA_TOOL_OPTIONS="-Xmx256m -XX:+UseSerialGC -XX:+ExitOnOutOfMemoryError"
# the embedded run database (unless TECTOMELT_DATABASE_URL names a PostgreSQL): keep it on a volume
VOLUME /data
STOPSIGNAL SIGTERM
USER tectomelt
EXPOSE 7070
HEALTHCHECK --interval=30s --timeout=3s --start-period=10s --retries=3 \
    CMD curl -fsS "http://127.0.0.1:${PORT}/v1/health" || exit 1
CMD ["java", "-jar", "/app/tectomelt.jar"]
