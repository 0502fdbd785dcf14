using System.Globalization;

namespace LaunchLogger.Cli.Bench;

/// <summary>Every run's errors as a CSV table, one row per run and figure our decoder reported:
/// for pooling seeds and looking at the error/σ distribution figure by figure, which the printed
/// coverage columns (two counts) cannot show.</summary>
public static class ErrorTable
{
    /// <summary>The table's header row; errors and σ are SI (s, m, m/s, %).</summary>
    public const string Header = "run,group,figure,error,sigma,error_over_sigma,naive_error";

    /// <summary>The header of a table of pooled seeds: each row's seed first.</summary>
    public const string PooledHeader = "seed," + Header;

    /// <summary>Writes the rows of <paramref name="outcomes"/> that have our error to
    /// <paramref name="writer"/>; <paramref name="withSeed"/>: each row's seed first (a run's
    /// index is its seed's own).</summary>
    public static void Write(IEnumerable<CaseOutcome> outcomes, TextWriter writer, bool withSeed = false)
    {
        writer.WriteLine(withSeed ? PooledHeader : Header);
        foreach (CaseOutcome o in outcomes.Where(o => o.Failure is null))
        {
            for (int m = 0; m < BenchFigure.All.Count; m++)
            {
                if (o.Ours[m] is not { } error)
                {
                    continue;
                }

                double? sigma = o.OurSigmas[m];
                double? z = sigma is > 0 ? error / sigma : null;
                writer.WriteLine((withSeed ? o.Seed.ToString(CultureInfo.InvariantCulture) + "," : "") + string.Join(',', o.Index.ToString(CultureInfo.InvariantCulture), o.Group, $"\"{BenchFigure.All[m].Name}\"", Number(error), Number(sigma), Number(z), Number(o.Naive[m])));
            }
        }
    }

    private static string Number(double? x) => x is { } v ? v.ToString("R", CultureInfo.InvariantCulture) : "";
}
