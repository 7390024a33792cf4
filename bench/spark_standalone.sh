#!/bin/bash
# A Spark standalone cluster (one master, one worker, executors in their own JVMs) on this
# machine, assembled from the Maven artifacts the build already has: no Spark download. Runs a
# campaign on it with --engine spark, optionally kills the executor JVM mid-run (SIGKILL: its
# running tasks are lost and retried on a new executor), runs the same plan on the local engine
# and compares every output byte. Never run in CI.
#
#   bench/spark_standalone.sh PLAN WORKDIR [KILL_AFTER_SECONDS]
#
# Needs `mvn -B package -DskipTests` first (target/obverse-cli.jar).
set -euo pipefail
plan=$1; work=$2; kill_after=${3:-0}
here=$(cd "$(dirname "$0")/.." && pwd)
mkdir -p "$work"; work=$(cd "$work" && pwd)
OPENS="-XX:+IgnoreUnrecognizedVMOptions --add-opens=java.base/java.lang=ALL-UNNAMED \
 --add-opens=java.base/java.lang.invoke=ALL-UNNAMED --add-opens=java.base/java.lang.reflect=ALL-UNNAMED \
 --add-opens=java.base/java.io=ALL-UNNAMED --add-opens=java.base/java.net=ALL-UNNAMED \
 --add-opens=java.base/java.nio=ALL-UNNAMED --add-opens=java.base/java.util=ALL-UNNAMED \
 --add-opens=java.base/java.util.concurrent=ALL-UNNAMED --add-opens=java.base/java.util.concurrent.atomic=ALL-UNNAMED \
 --add-opens=java.base/jdk.internal.ref=ALL-UNNAMED --add-opens=java.base/sun.nio.ch=ALL-UNNAMED \
 --add-opens=java.base/sun.nio.cs=ALL-UNNAMED --add-opens=java.base/sun.security.action=ALL-UNNAMED \
 --add-opens=java.base/sun.util.calendar=ALL-UNNAMED --add-opens=java.security.jgss/sun.security.krb5=ALL-UNNAMED \
 -Djdk.reflect.useDirectMethodHandle=false -Dio.netty.tryReflectionSetAccessible=true"

# A Spark home: jars/ with Spark and its dependencies from the Maven class path, and a RELEASE
# file, which tells Spark's launcher (used by the worker to start executors) to take jars/.
(cd "$here" && mvn -B -q dependency:build-classpath -Dmdep.includeScope=provided -Dmdep.outputFile="$work/cp.txt")
export SPARK_HOME="$work/spark-home" SPARK_SCALA_VERSION=2.13
rm -rf "$SPARK_HOME"; mkdir -p "$SPARK_HOME/jars"
tr ':' '\n' < "$work/cp.txt" | while read -r j; do ln -s "$j" "$SPARK_HOME/jars/"; done
echo "Spark assembled from Maven artifacts" > "$SPARK_HOME/RELEASE"
CP="$SPARK_HOME/jars/*"

java $OPENS -cp "$CP" org.apache.spark.deploy.master.Master --host 127.0.0.1 --port 7077 \
    --webui-port 8089 > "$work/master.log" 2>&1 & master=$!
sleep 10
java $OPENS -cp "$CP" org.apache.spark.deploy.worker.Worker --cores 2 --memory 2g --webui-port 8090 \
    --work-dir "$work/executors" spark://127.0.0.1:7077 > "$work/worker.log" 2>&1 & worker=$!
trap 'kill $worker $master 2>/dev/null || true' EXIT
sleep 10

rm -rf "$work/camp-spark" "$work/camp-local"
/usr/bin/time -f "spark standalone: %e s wall, %U s user" \
  java $OPENS -cp "$CP:$here/target/obverse-cli.jar" org.apache.spark.deploy.SparkSubmit \
    --master spark://127.0.0.1:7077 --deploy-mode client --class org.obverse.cli.Main \
    --driver-java-options "$OPENS" --conf "spark.executor.extraJavaOptions=$OPENS" \
    --conf spark.log.level=WARN --conf spark.ui.enabled=false --executor-cores 2 \
    "$here/target/obverse-cli.jar" campaign run "$plan" --out "$work/camp-spark" --engine spark --quiet \
    > "$work/spark.log" 2>&1 & submit=$!
if [ "$kill_after" -gt 0 ]; then
  sleep "$kill_after"
  pkill -9 -f CoarseGrainedExecutorBackend && echo "killed the executor JVM after ${kill_after} s"
fi
wait $submit
grep -h "Lost task" "$work/spark.log" | sed 's/^/  /' || true
/usr/bin/time -f "local engine: %e s wall, %U s user" \
  java -jar "$here/target/obverse-cli.jar" campaign run "$plan" --out "$work/camp-local" --quiet > "$work/local.log" 2>&1
for f in results.csv jobs.csv ground.csv audit.txt; do cmp "$work/camp-spark/$f" "$work/camp-local/$f"; done
diff -r "$work/camp-spark/raw" "$work/camp-local/raw" > /dev/null
diff -r "$work/camp-spark/decoded" "$work/camp-local/decoded" > /dev/null
echo "same bytes: results.csv, jobs.csv, ground.csv, audit.txt, raw/, decoded/"
