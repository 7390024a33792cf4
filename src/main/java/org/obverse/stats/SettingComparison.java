package org.obverse.stats;

/**
 * Setting A against setting B instance by instance, on the instances run under both: how
 * many A makes faster (TTS_A &lt; TTS_B), slower, or leaves tied (equal TTS, including both
 * infinite), the fraction improved (faster / paired), and the two-sided sign-test p-value
 * over the untied instances ({@link SignTest}).
 *
 * @param paired     instances run under both settings
 * @param faster     instances where A's TTS is less than B's
 * @param slower     instances where A's TTS is greater than B's
 * @param ties       instances with equal TTS
 * @param fractionImproved faster / paired (NaN when nothing is paired)
 * @param signTestP  two-sided sign-test p-value (1 when every pair is tied)
 */
public record SettingComparison(int paired, int faster, int slower, int ties, double fractionImproved,
        double signTestP) {

    /** Compares per-instance TTS values of A and B (NaN marks an instance not run under that setting). */
    public static SettingComparison of(double[] ttsA, double[] ttsB) {
        if (ttsA.length != ttsB.length) {
            throw new IllegalArgumentException("need one TTS per instance for both settings, got " + ttsA.length
                    + " and " + ttsB.length);
        }
        int paired = 0;
        int faster = 0;
        int slower = 0;
        for (int i = 0; i < ttsA.length; i++) {
            double a = ttsA[i];
            double b = ttsB[i];
            if (Double.isNaN(a) || Double.isNaN(b)) {
                continue;
            }
            paired++;
            if (a < b) {
                faster++;
            } else if (a > b) {
                slower++;
            }
        }
        int ties = paired - faster - slower;
        return new SettingComparison(paired, faster, slower, ties,
                paired == 0 ? Double.NaN : (double) faster / paired, SignTest.twoSidedP(faster, faster + slower));
    }
}
