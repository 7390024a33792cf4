package org.obverse.model;

import java.util.Arrays;
import java.util.HashMap;
import java.util.Map;
import java.util.TreeSet;

/** Collects linear and pairwise terms by id for the builders, refusing duplicates. */
final class TermTable {
    private final String linearName;
    private final String pairName;
    private final Map<Integer, Double> linear = new HashMap<>();
    private final Map<Long, Double> pairs = new HashMap<>();
    private final TreeSet<Integer> ids = new TreeSet<>();
    private double offset;

    TermTable(String linearName, String pairName) {
        this.linearName = linearName;
        this.pairName = pairName;
    }

    private static void checkId(int id, String what) {
        if (id < 0) {
            throw new InvalidProblemException(what + ": id " + id + " is negative; ids must be >= 0");
        }
    }

    private static void checkFinite(double v, String what) {
        if (!Double.isFinite(v)) {
            throw new InvalidProblemException(what + " is " + v + ", not a finite number");
        }
    }

    void variable(int id) {
        checkId(id, "variable " + id);
        ids.add(id);
    }

    void linear(int id, double value) {
        String what = linearName + " of " + id;
        checkId(id, what);
        checkFinite(value, what);
        if (linear.putIfAbsent(id, value) != null) {
            throw new InvalidProblemException(what + " is given twice");
        }
        ids.add(id);
    }

    void pair(int i, int j, double value) {
        String what = pairName + " (" + i + ", " + j + ")";
        checkId(i, what);
        checkId(j, what);
        if (i == j) {
            throw new InvalidProblemException(what + " joins a variable to itself");
        }
        checkFinite(value, what);
        long key = key(Math.min(i, j), Math.max(i, j));
        if (pairs.putIfAbsent(key, value) != null) {
            throw new InvalidProblemException(what + " is given twice");
        }
        ids.add(i);
        ids.add(j);
    }

    void offset(double value) {
        checkFinite(value, "offset");
        offset = value;
    }

    private static long key(int lo, int hi) {
        return ((long) lo << 32) | (hi & 0xffffffffL);
    }

    /** Sorted terms by position. */
    Arrays4 arrays() {
        int[] idArray = ids.stream().mapToInt(Integer::intValue).toArray();
        VariableIndex index = VariableIndex.of(idArray);
        double[] lin = new double[index.size()];
        for (Map.Entry<Integer, Double> t : linear.entrySet()) {
            lin[index.indexOf(t.getKey())] = t.getValue();
        }
        long[] keys = new long[pairs.size()];
        int m = 0;
        for (Long k : pairs.keySet()) {
            int lo = (int) (k >>> 32);
            int hi = (int) (long) k;
            // Re-key by position so that sorting gives ascending (u, v).
            keys[m++] = key(index.indexOf(lo), index.indexOf(hi));
        }
        Arrays.sort(keys);
        int[] u = new int[m];
        int[] v = new int[m];
        double[] w = new double[m];
        for (int e = 0; e < m; e++) {
            u[e] = (int) (keys[e] >>> 32);
            v[e] = (int) keys[e];
            w[e] = pairs.get(key(index.id(u[e]), index.id(v[e])));
        }
        return new Arrays4(index, lin, u, v, w, offset);
    }

    record Arrays4(VariableIndex index, double[] linear, int[] u, int[] v, double[] pair, double offset) {
    }
}
