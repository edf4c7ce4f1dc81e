/* testbench.h — one benchmark case in a child process, so that its peak
 * memory (util_peak_rss) is its own and a crash or exit in it is reported
 * instead of ending the benchmark.
 *
 * Ownership: `out` (size bytes) is the caller's; the child fills its own copy
 * and sends it back through a pipe into the caller's.
 */
#ifndef CAIRN_TESTBENCH_H
#define CAIRN_TESTBENCH_H

#include <stddef.h>

/* Run fn(arg, out) in a child (its copy of out zeroed first) and copy the
 * child's out back.  0, or -1 when the child could not be started, failed
 * (nonzero exit, signal) or sent less than size bytes. */
int testbench_in_child(void (*fn)(void *arg, void *out), void *arg, void *out, size_t size);

#endif
