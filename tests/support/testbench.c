/* testbench.c — benchmark cases in child processes. */
#include "config.h"

#include "testbench.h"

#include <stdio.h>
#include <string.h>
#include <sys/wait.h>
#include <unistd.h>

int testbench_in_child(void (*fn)(void *arg, void *out), void *arg, void *out, size_t size) {
  int fd[2];
  if (pipe(fd) != 0) return -1;
  fflush(stdout); /* the child must not print the parent's buffered lines again */
  pid_t pid = fork();
  if (pid < 0) {
    close(fd[0]);
    close(fd[1]);
    return -1;
  }
  if (pid == 0) {
    close(fd[0]);
    memset(out, 0, size);
    fn(arg, out);
    ssize_t w = write(fd[1], out, size);
    _exit(w == (ssize_t)size ? 0 : 1);
  }
  close(fd[1]);
  ssize_t got = read(fd[0], out, size);
  close(fd[0]);
  int st = 0;
  waitpid(pid, &st, 0);
  return got == (ssize_t)size && WIFEXITED(st) && WEXITSTATUS(st) == 0 ? 0 : -1;
}
