/**
 * Apache Spark as the engine of a campaign's run and collect: the jobs of {@code jobs.csv}
 * become one partitioned dataset, each task calls the same per-job functions as the local
 * engine on a campaign folder every executor sees at the same path, and the steps merge the
 * per-job rows on the driver by job index. Spark is a provided dependency: present under
 * {@code spark-submit} and in the tests, absent from the command-line jar. Nothing below this
 * package imports it; only the command line reaches it, after checking Spark is there.
 */
package org.obverse.campaign.spark;
