/**
 * Apache Spark as the engine of a campaign's run and collect: the jobs of {@code jobs.csv}
 * become one partitioned dataset, each task calls the same per-job functions as the local
 * engine, and the steps merge the per-job rows on the driver by job index. The campaign folder
 * is either a path every executor sees at the same place, or a folder on a Hadoop file system
 * (hdfs://, s3a://, …: {@link org.obverse.campaign.spark.HadoopCampaign}), whose job inputs each
 * task copies to its executor and whose job outputs it publishes whole, by rename or by direct
 * object write ({@link org.obverse.campaign.spark.HadoopFolder}). Spark, and the Hadoop client
 * that comes with it, is a provided dependency: present under {@code spark-submit} and in the
 * tests, absent from the command-line jar. Nothing below this package imports it; only the
 * command line reaches it, after checking Spark is there.
 */
package org.obverse.campaign.spark;
