package org.obverse.model;

import java.util.Arrays;

/**
 * Collects linear and pairwise terms by id for the builders, refusing duplicates. Primitive
 * arrays and an open-addressing table rather than boxed maps and sets: a problem file holds
 * thousands of terms, and reading it is the set-up of every command.
 */
final class TermTable {
    private final String linearName;
    private final String pairName;
    private final Slots linearSlots = new Slots();
    private double[] linearValues = new double[16];
    private final Slots pairSlots = new Slots();
    private double[] pairValues = new double[16];
    private int[] ids = new int[32];
    private int idCount;
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

    // The name of a term is built only for a refusal: a problem file holds thousands of terms.
    void variable(int id) {
        if (id < 0) {
            checkId(id, "variable " + id);
        }
        addId(id);
    }

    void linear(int id, double value) {
        if (id < 0 || !Double.isFinite(value)) {
            String what = linearName + " of " + id;
            checkId(id, what);
            checkFinite(value, what);
        }
        int slot = linearSlots.add(id);
        if (slot < 0) {
            throw new InvalidProblemException(linearName + " of " + id + " is given twice");
        }
        linearValues = grow(linearValues, slot);
        linearValues[slot] = value;
        addId(id);
    }

    void pair(int i, int j, double value) {
        if (i < 0 || j < 0 || i == j || !Double.isFinite(value)) {
            String what = pairName + " (" + i + ", " + j + ")";
            checkId(i, what);
            checkId(j, what);
            if (i == j) {
                throw new InvalidProblemException(what + " joins a variable to itself");
            }
            checkFinite(value, what);
        }
        long key = key(Math.min(i, j), Math.max(i, j));
        int slot = pairSlots.add(key);
        if (slot < 0) {
            throw new InvalidProblemException(pairName + " (" + i + ", " + j + ") is given twice");
        }
        pairValues = grow(pairValues, slot);
        pairValues[slot] = value;
        addId(i);
        addId(j);
    }

    void offset(double value) {
        checkFinite(value, "offset");
        offset = value;
    }

    private static long key(int lo, int hi) {
        return ((long) lo << 32) | (hi & 0xffffffffL);
    }

    private void addId(int id) {
        if (idCount == ids.length) {
            ids = Arrays.copyOf(ids, 2 * idCount);
        }
        ids[idCount++] = id;
    }

    private static double[] grow(double[] a, int slot) {
        return slot < a.length ? a : Arrays.copyOf(a, Math.max(2 * a.length, slot + 1));
    }

    /** Sorted terms by position. */
    Arrays4 arrays() {
        VariableIndex index = VariableIndex.of(Arrays.copyOf(ids, idCount));
        double[] lin = new double[index.size()];
        for (int t = 0; t < linearSlots.size(); t++) {
            lin[index.indexOf((int) linearSlots.key(t))] = linearValues[t];
        }
        int m = pairSlots.size();
        long[] keys = new long[m];
        for (int t = 0; t < m; t++) {
            long k = pairSlots.key(t);
            // Re-key by position so that sorting gives ascending (u, v).
            keys[t] = key(index.indexOf((int) (k >>> 32)), index.indexOf((int) k));
        }
        Arrays.sort(keys);
        int[] u = new int[m];
        int[] v = new int[m];
        double[] w = new double[m];
        for (int e = 0; e < m; e++) {
            u[e] = (int) (keys[e] >>> 32);
            v[e] = (int) keys[e];
            w[e] = pairValues[pairSlots.find(key(index.id(u[e]), index.id(v[e])))];
        }
        return new Arrays4(index, lin, u, v, w, offset);
    }

    /** Distinct long keys numbered 0, 1, … in the order first added (open addressing, linear probing). */
    private static final class Slots {
        private long[] table = new long[64];
        private int[] slotOf = new int[64]; // slot + 1; 0 = empty
        private long[] keys = new long[16];
        private int size;

        int size() {
            return size;
        }

        long key(int slot) {
            return keys[slot];
        }

        /** The new key's slot, or −1 where the key is present already. */
        int add(long key) {
            if (2 * (size + 1) > table.length) {
                rehash();
            }
            int mask = table.length - 1;
            for (int h = hash(key) & mask; ; h = (h + 1) & mask) {
                if (slotOf[h] == 0) {
                    table[h] = key;
                    slotOf[h] = size + 1;
                    if (size == keys.length) {
                        keys = Arrays.copyOf(keys, 2 * size);
                    }
                    keys[size] = key;
                    return size++;
                }
                if (table[h] == key) {
                    return -1;
                }
            }
        }

        /** The slot of a present key, −1 where absent. */
        int find(long key) {
            int mask = table.length - 1;
            for (int h = hash(key) & mask; slotOf[h] != 0; h = (h + 1) & mask) {
                if (table[h] == key) {
                    return slotOf[h] - 1;
                }
            }
            return -1;
        }

        private void rehash() {
            long[] oldTable = table;
            int[] oldSlots = slotOf;
            table = new long[oldTable.length * 2];
            slotOf = new int[oldTable.length * 2];
            int mask = table.length - 1;
            for (int i = 0; i < oldTable.length; i++) {
                if (oldSlots[i] != 0) {
                    int h = hash(oldTable[i]) & mask;
                    while (slotOf[h] != 0) {
                        h = (h + 1) & mask;
                    }
                    table[h] = oldTable[i];
                    slotOf[h] = oldSlots[i];
                }
            }
        }

        private static int hash(long key) {
            long z = key * 0x9E3779B97F4A7C15L;
            return (int) (z ^ (z >>> 32));
        }
    }

    record Arrays4(VariableIndex index, double[] linear, int[] u, int[] v, double[] pair, double offset) {
    }
}
