using System.CommandLine;
using System.Globalization;
using LaunchLogger.Cli.Bench;

namespace LaunchLogger.Cli.Verbs;

/// <summary><c>launchlogger bench braking</c>: stopping distance, brake onset and grade against
/// simulated truth over many stops from 60 mph.</summary>
public static class BenchBrakingCommand
{
    /// <summary>Builds the verb.</summary>
    public static Command Create()
    {
        var runs = new Option<int>("--runs") { Description = "Simulated stops.", DefaultValueFactory = _ => 120 };
        var seed = new Option<int>("--seed") { Description = "Seed for the variations and the noise.", DefaultValueFactory = _ => 1 };
        var list = new Option<bool>("--list") { Description = "Also print every stop's errors." };
        var command = new Command("braking", "Stopping distance, brake onset and grade errors against simulated truth.") { runs, seed, list };
        command.SetAction((parse, cancel) => Task.FromResult((int)Run(parse.GetValue(runs), parse.GetValue(seed), parse.GetValue(list), parse.InvocationConfiguration.Output, parse.InvocationConfiguration.Error, cancel)));
        return command;
    }

    /// <summary>Runs the benchmark.</summary>
    public static ExitCode Run(int runs, int seed, bool list, TextWriter output, TextWriter error, CancellationToken cancel = default)
    {
        if (runs < 1 || runs > 100_000)
        {
            error.WriteLine("launchlogger bench braking: --runs must be from 1 to 100000");
            return ExitCode.Usage;
        }

        List<BrakingOutcome> all;
        try
        {
            all = ParallelCases.Run(BrakingCase.Build(runs, seed), BrakingBenchmark.Run, "bench braking: stops simulated and decoded", error, cancel);
        }
        catch (OperationCanceledException)
        {
            error.WriteLine("bench braking: cancelled");
            return ExitCode.Cancelled;
        }

        output.WriteLine($"bench braking: {runs} simulated stops from just above 60 mph, seed {seed}; error = estimate − truth; mounting calibrated on level ground");
        foreach (BrakingOutcome failed in all.Where(o => o.Failure != null))
        {
            output.WriteLine($"  stop {failed.Case.Index} failed: {failed.Failure} ({failed.Case.Summary})");
        }

        List<BrakingOutcome> ok = all.Where(o => o.Failure == null).ToList();
        Group("With a brake switch (delay measured, told to ±1 ms)", ok.Where(o => o.Case.HasSwitch).ToList(), output);
        Unmeasured(ok.Where(o => o.Case.HasSwitch).ToList(), output);
        Group("Without a switch (onset from the deceleration)", ok.Where(o => !o.Case.HasSwitch).ToList(), output);
        Group("All stops", ok, output);
        double[] distance = Percentiles.AbsSorted(ok.Select(o => o.DistanceErrorM));
        double[] onset = Percentiles.AbsSorted(ok.Select(o => o.OnsetErrorS), 1000);
        double[] grade = Percentiles.AbsSorted(ok.Select(o => o.GradeErrorDeg));
        output.WriteLine();
        output.WriteLine("  goals (all stops):");
        Goal(output, "stopping distance p95 ≤ 0.15 m", Percentiles.Of(distance, 0.95), 0.15, "m");
        Goal(output, "brake onset p95 ≤ 10 ms", Percentiles.Of(onset, 0.95), 10, "ms");
        Goal(output, "grade p95 ≤ 0.1°", Percentiles.Of(grade, 0.95), 0.1, "°");
        if (list)
        {
            output.WriteLine();
            foreach (BrakingOutcome o in all)
            {
                output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  {o.Case.Index,4} distance {o.DistanceErrorM,8:+0.000;-0.000} m  onset {o.OnsetErrorS * 1000,7:+0.0;-0.0} ms  grade {o.GradeErrorDeg,7:+0.000;-0.000}°  {o.Case.Summary}{(o.Failure is null ? "" : " FAILED: " + o.Failure)}"));
            }
        }

        return ExitCode.Ok;
    }

    private static void Group(string title, List<BrakingOutcome> group, TextWriter output)
    {
        output.WriteLine();
        output.WriteLine($"{title}: {group.Count} stops");
        if (group.Count == 0)
        {
            return;
        }

        output.WriteLine("  figure                 unit |    p50     p95     max");
        Row("stopping distance", "m", Percentiles.AbsSorted(group.Select(o => o.DistanceErrorM)));
        Row("brake onset", "ms", Percentiles.AbsSorted(group.Select(o => o.OnsetErrorS), 1000));
        Row("MFDD", "m/s²", Percentiles.AbsSorted(group.Select(o => o.MfddErrorMps2)));
        Row("grade", "°", Percentiles.AbsSorted(group.Select(o => o.GradeErrorDeg)));
        output.WriteLine("  truth within our ±2σ / ±3σ:");
        Cover("stopping distance", group.Select(o => (o.DistanceErrorM, o.DistanceSigmaM)));
        Cover("brake onset", group.Select(o => (o.OnsetErrorS, o.OnsetSigmaS)));
        Cover("grade", group.Select(o => (o.GradeErrorDeg, o.GradeSigmaDeg)));

        void Row(string name, string unit, double[] sorted) =>
            output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  {name,-22} {unit,4} | {Percentiles.Of(sorted, 0.5),7:0.000} {Percentiles.Of(sorted, 0.95),7:0.000} {Percentiles.Max(sorted),7:0.000}"));

        void Cover(string name, IEnumerable<(double? Error, double? Sigma)> pairs)
        {
            var z = pairs.Where(p => p.Error is not null && p.Sigma > 0).Select(p => Math.Abs(p.Error!.Value) / p.Sigma!.Value).ToList();
            double Share(double k) => z.Count == 0 ? double.NaN : 100.0 * z.Count(x => x <= k) / z.Count;
            output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"    {name,-20} {Share(2),6:0.0} % {Share(3),6:0.0} %   (n {z.Count})"));
        }
    }

    /// <summary>The switch stops decoded again without the switch's delay (its 0–30 ms prior).</summary>
    private static void Unmeasured(List<BrakingOutcome> group, TextWriter output)
    {
        var distance = group.Where(o => o.UnmeasuredDelayDistanceM is not null).Select(o => o.UnmeasuredDelayDistanceM!.Value).ToList();
        var onset = group.Where(o => o.UnmeasuredDelayOnsetS is not null).Select(o => o.UnmeasuredDelayOnsetS!.Value).ToList();
        output.WriteLine();
        output.WriteLine($"With a brake switch, delay not measured (uniform 0–30 ms prior, with the accelerometer's deceleration): {onset.Count} stops");
        if (onset.Count == 0)
        {
            return;
        }

        output.WriteLine("  figure                 unit |    p50     p95     max  | within ±2σ / ±3σ");
        Row("stopping distance", "m", distance, 1);
        Row("brake onset", "ms", onset, 1000);

        void Row(string name, string unit, List<(double Error, double Sigma)> pairs, double scale)
        {
            double[] sorted = Percentiles.AbsSorted(pairs.Select(p => (double?)p.Error), scale);
            var z = pairs.Where(p => p.Sigma > 0).Select(p => Math.Abs(p.Error) / p.Sigma).ToList();
            double Share(double k) => z.Count == 0 ? double.NaN : 100.0 * z.Count(x => x <= k) / z.Count;
            output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"  {name,-22} {unit,4} | {Percentiles.Of(sorted, 0.5),7:0.000} {Percentiles.Of(sorted, 0.95),7:0.000} {Percentiles.Max(sorted),7:0.000}  | {Share(2),6:0.0} % {Share(3),6:0.0} %"));
        }
    }

    private static void Goal(TextWriter output, string text, double value, double limit, string unit) =>
        output.WriteLine(string.Create(CultureInfo.InvariantCulture, $"    {text}: {value:0.000} {unit} — {(value <= limit ? "met" : "NOT met")}"));
}
