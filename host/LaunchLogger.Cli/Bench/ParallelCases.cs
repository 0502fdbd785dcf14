using System.Collections.Concurrent;

namespace LaunchLogger.Cli.Bench;

/// <summary>Runs benchmark cases on every core, printing progress every tenth of the way.</summary>
public static class ParallelCases
{
    /// <summary>Runs <paramref name="work"/> on each case; results come back in case order.</summary>
    /// <exception cref="OperationCanceledException">Cancelled.</exception>
    public static List<TResult> Run<TCase, TResult>(IReadOnlyList<TCase> cases, Func<TCase, CancellationToken, TResult> work, string label, TextWriter progress, CancellationToken cancel)
    {
        var results = new ConcurrentDictionary<int, TResult>();
        int done = 0;
        int step = Math.Max(1, cases.Count / 10);
        Parallel.For(0, cases.Count, new ParallelOptions { CancellationToken = cancel, MaxDegreeOfParallelism = Environment.ProcessorCount }, i =>
        {
            results[i] = work(cases[i], cancel);
            int n = Interlocked.Increment(ref done);
            if (n % step == 0 || n == cases.Count)
            {
                lock (progress)
                {
                    progress.WriteLine($"{label}: {n}/{cases.Count}");
                }
            }
        });
        return Enumerable.Range(0, cases.Count).Select(i => results[i]).ToList();
    }
}
