package org.thermotile.jobs.testing;

/** Process helpers shared by the lock tests. */
public final class Processes {
    private Processes() {}

    /** The PID of a process that has ended (a stale lock's holder). */
    public static long deadPid() throws Exception {
        Process p = new ProcessBuilder("true").start();
        p.waitFor();
        long pid = p.pid();
        if (ProcessHandle.of(pid).map(ProcessHandle::isAlive).orElse(false)) {
            throw new IllegalStateException("process " + pid + " still alive after waitFor");
        }
        return pid;
    }
}
