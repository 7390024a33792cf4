package org.obverse.random;

import org.apache.commons.rng.UniformRandomProvider;

/**
 * Standard normal deviates by the Marsaglia polar method (Marsaglia &amp; Bray, SIAM Review
 * 6(3), 1964): draw (x, y) uniform on the square [−1, 1)² until 0 &lt; r = x² + y² &lt; 1, then
 * return x · √(−2 ln r / r). Two uniforms per try, accepted with probability π/4; the second
 * deviate of the pair is dropped, so each call depends only on the generator's state.
 * {@link StrictMath} keeps the numbers the same on every machine.
 */
public final class StandardNormal {
    private StandardNormal() {
    }

    /** One N(0, 1) deviate. */
    public static double draw(UniformRandomProvider rng) {
        while (true) {
            double x = 2.0 * rng.nextDouble() - 1.0;
            double y = 2.0 * rng.nextDouble() - 1.0;
            double r = x * x + y * y;
            if (r > 0.0 && r < 1.0) {
                return x * StrictMath.sqrt(-2.0 * StrictMath.log(r) / r);
            }
        }
    }
}
