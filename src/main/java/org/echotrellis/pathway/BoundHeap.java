package org.echotrellis.pathway;

import java.util.Arrays;

/** A binary max-heap of (bound, id) pairs on primitive arrays; grows on demand. Not thread-safe. */
final class BoundHeap {
    private double[] key = new double[256];
    private int[] id = new int[256];
    private int size;

    int size() {
        return size;
    }

    void clear() {
        size = 0;
    }

    void push(double bound, int item) {
        if (size == key.length) {
            key = Arrays.copyOf(key, size * 2);
            id = Arrays.copyOf(id, size * 2);
        }
        int i = size++;
        while (i > 0) {
            int parent = (i - 1) >>> 1;
            if (key[parent] >= bound) {
                break;
            }
            key[i] = key[parent];
            id[i] = id[parent];
            i = parent;
        }
        key[i] = bound;
        id[i] = item;
    }

    /** @return the largest bound (heap must not be empty) */
    double peekBound() {
        return key[0];
    }

    /** Removes and returns the id with the largest bound (heap must not be empty). */
    int pop() {
        int top = id[0];
        size--;
        if (size > 0) {
            double k = key[size];
            int v = id[size];
            int i = 0;
            while (true) {
                int c = 2 * i + 1;
                if (c >= size) {
                    break;
                }
                if (c + 1 < size && key[c + 1] > key[c]) {
                    c++;
                }
                if (key[c] <= k) {
                    break;
                }
                key[i] = key[c];
                id[i] = id[c];
                i = c;
            }
            key[i] = k;
            id[i] = v;
        }
        return top;
    }
}
