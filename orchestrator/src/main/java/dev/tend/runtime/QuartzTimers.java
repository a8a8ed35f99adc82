package dev.tend.runtime;

import dev.tend.shared.TendException;
import dev.tend.shared.time.Timers;
import org.quartz.Job;
import org.quartz.JobBuilder;
import org.quartz.JobExecutionContext;
import org.quartz.JobExecutionException;
import org.quartz.JobKey;
import org.quartz.Scheduler;
import org.quartz.SchedulerException;
import org.quartz.SimpleScheduleBuilder;
import org.quartz.Trigger;
import org.quartz.TriggerBuilder;
import org.quartz.impl.StdSchedulerFactory;
import org.quartz.impl.matchers.GroupMatcher;
import org.quartz.simpl.RAMJobStore;

import java.time.Instant;
import java.util.Date;
import java.util.Objects;
import java.util.Properties;
import java.util.Set;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.Consumer;

/**
 * The {@link Timers} port on a Quartz scheduler with the in-memory job store (DESIGN.md
 * section 9): one job per timer key, whose trigger hands the key to {@code fire} at its due
 * time (at once when the time has passed, as after a restart). Nothing is kept across
 * processes here: the engine knows its armed timers, and {@link Orchestrator#recover()} arms
 * them again on start. Thread-safe; {@code fire} is called on Quartz's thread and must not block.
 */
public final class QuartzTimers implements Timers, AutoCloseable {
    private static final String GROUP = "tend";
    private static final String FIRE = "tend.fire";
    private static final String KEY = "key";
    private static final AtomicInteger INSTANCES = new AtomicInteger();

    private final Scheduler scheduler;

    /** Timers that hand each fired key to {@code fire}. */
    public QuartzTimers(Consumer<String> fire) {
        this();
        fireInto(fire);
    }

    /**
     * Timers whose consumer is named later, with {@link #fireInto}, before the first is armed:
     * for a driver that needs its timers to be built.
     */
    public QuartzTimers() {
        Properties p = new Properties();
        // scheduler names are global to the JVM; several servers may live in one (tests)
        p.setProperty(StdSchedulerFactory.PROP_SCHED_INSTANCE_NAME, "tend-timers-" + INSTANCES.incrementAndGet());
        p.setProperty(StdSchedulerFactory.PROP_JOB_STORE_CLASS, RAMJobStore.class.getName());
        p.setProperty("org.quartz.threadPool.threadCount", "1");
        p.setProperty("org.quartz.threadPool.makeThreadsDaemons", "true");
        p.setProperty("org.quartz.scheduler.makeSchedulerThreadDaemon", "true");
        p.setProperty("org.quartz.jobStore.misfireThreshold", "1000");
        try {
            scheduler = new StdSchedulerFactory(p).getScheduler();
            scheduler.start();
        } catch (SchedulerException e) {
            throw new TimersFailedException("could not start the timer scheduler: " + e.getMessage(), e);
        }
    }

    /** Hands each fired key to {@code fire} from now on; call it before arming the first timer. */
    public void fireInto(Consumer<String> fire) {
        Objects.requireNonNull(fire, "fire");
        try {
            scheduler.getContext().put(FIRE, fire);
        } catch (SchedulerException e) {
            throw new TimersFailedException("could not set where timers fire: " + e.getMessage(), e);
        }
    }

    @Override
    public void arm(String key, Instant due) {
        Objects.requireNonNull(key, "key");
        Objects.requireNonNull(due, "due");
        try {
            if (!scheduler.getContext().containsKey(FIRE)) throw new IllegalStateException("fireInto must name a consumer before a timer is armed");
        } catch (SchedulerException e) {
            throw new TimersFailedException("could not read the timer scheduler's context: " + e.getMessage(), e);
        }
        var job = JobBuilder.newJob(FireJob.class).withIdentity(key, GROUP).usingJobData(KEY, key).build();
        Trigger trigger = TriggerBuilder.newTrigger().withIdentity(key, GROUP).startAt(notBefore(due))
                .withSchedule(SimpleScheduleBuilder.simpleSchedule().withMisfireHandlingInstructionFireNow())
                .build();
        try {
            scheduler.scheduleJob(job, Set.of(trigger), true);
        } catch (SchedulerException e) {
            throw new TimersFailedException("could not arm timer " + key + " for " + due + ": " + e.getMessage(), e);
        }
    }

    /**
     * Quartz keeps whole milliseconds and its scheduler thread fires a trigger once less than
     * about 2 ms remain; rounding up and adding that margin means a timer never fires before
     * its due time.
     */
    static Date notBefore(Instant due) {
        Instant ms = due.truncatedTo(java.time.temporal.ChronoUnit.MILLIS);
        if (ms.isBefore(due)) ms = ms.plusMillis(1);
        return Date.from(ms.plusMillis(2));
    }

    @Override
    public void cancel(String key) {
        try {
            scheduler.deleteJob(JobKey.jobKey(key, GROUP));
        } catch (SchedulerException e) {
            throw new TimersFailedException("could not cancel timer " + key + ": " + e.getMessage(), e);
        }
    }

    /** How many timers are armed and have not fired yet. */
    public int armedCount() {
        try {
            return scheduler.getJobKeys(GroupMatcher.jobGroupEquals(GROUP)).size();
        } catch (SchedulerException e) {
            throw new TimersFailedException("could not count armed timers: " + e.getMessage(), e);
        }
    }

    /** Stops the scheduler without waiting for a firing in progress; timers not fired are dropped. */
    @Override
    public void close() {
        try {
            scheduler.shutdown(false);
        } catch (SchedulerException e) {
            throw new TimersFailedException("could not stop the timer scheduler: " + e.getMessage(), e);
        }
    }

    /** The Quartz job of one timer: hands its key to the consumer in the scheduler's context. */
    public static final class FireJob implements Job {
        @Override
        public void execute(JobExecutionContext context) throws JobExecutionException {
            try {
                @SuppressWarnings("unchecked")
                Consumer<String> fire = (Consumer<String>) context.getScheduler().getContext().get(FIRE);
                fire.accept(context.getMergedJobDataMap().getString(KEY));
            } catch (SchedulerException e) {
                throw new JobExecutionException(e);
            }
        }
    }

    /** The timer scheduler failed: it could not start, arm, cancel or stop. */
    public static final class TimersFailedException extends TendException {
        TimersFailedException(String message, Throwable cause) {
            super(message, cause);
        }
    }
}
