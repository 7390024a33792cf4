package org.obverse.stats;

/**
 * The score of one instance under one setting, pooled over its gauges and as the spread over
 * gauges. TTS values are in the unit of the run times (µs in the results table); +∞ where no
 * read succeeded.
 *
 * @param instance          index of the instance in the campaign
 * @param setting           index of the setting in the campaign
 * @param gauges            number of gauges (a run without gauges counts as one)
 * @param reads             reads over all gauges
 * @param successes         successful reads over all gauges
 * @param pSuccess          successes / reads (pooled over gauges)
 * @param wilson            Wilson interval of pSuccess
 * @param clopperPearson    Clopper–Pearson interval of pSuccess
 * @param runTime           read-weighted mean run time of one anneal
 * @param tts               pooled TTS at the target
 * @param ttsLow            TTS at the Clopper–Pearson upper bound of p (the optimistic end)
 * @param ttsHigh           TTS at the Clopper–Pearson lower bound of p (the pessimistic end)
 * @param residualMean      mean of (energy − ground) over reads
 * @param minEnergy         least energy seen
 * @param brokenMean        mean broken chains per read
 * @param gaugeP            five-number summary of per-gauge success (min, q1, median, q3, max; type 7)
 * @param gaugePMean        unweighted mean over gauges of per-gauge success
 * @param gaugeTtsMedian    median over gauges of per-gauge TTS (type 7, infinite rule of {@link Quantiles})
 */
public record CellScore(int instance, int setting, int gauges, long reads, long successes, double pSuccess,
        BinomialInterval wilson, BinomialInterval clopperPearson, double runTime, double tts, double ttsLow,
        double ttsHigh, double residualMean, double minEnergy, double brokenMean, double[] gaugeP,
        double gaugePMean, double gaugeTtsMedian) {
}
