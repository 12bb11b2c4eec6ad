#!/bin/sh
# Container entry point: the JVM defaults of JAVA_OPTS (heap, collector, exit on OOM), then any
# arguments. JAVA_TOOL_OPTIONS, if the user sets it, is read by the JVM in addition (it does not
# replace JAVA_OPTS). exec: java becomes PID 1's child-free replacement and receives SIGTERM itself.
set -eu
# say so when a user's JAVA_TOOL_OPTIONS sets what JAVA_OPTS also sets: the command line (JAVA_OPTS) wins
for opt in -Xmx -Xms -XX:+Use; do
  case " ${JAVA_TOOL_OPTIONS:-} " in
    *" $opt"*) case " ${JAVA_OPTS:-} " in
                 *" $opt"*) echo "tectomelt: JAVA_OPTS sets $opt too and takes precedence over JAVA_TOOL_OPTIONS; set JAVA_OPTS to change it" >&2 ;;
               esac ;;
  esac
done
# shellcheck disable=SC2086  # JAVA_OPTS is a list of options, split on purpose
exec java ${JAVA_OPTS:-} -jar /app/tectomelt.jar "$@"
