using System.Globalization;

namespace LaunchLogger.Cli.Bench;

/// <summary>The seeds <c>bench accuracy --seeds</c> pools: "1-4" (a range), "1,3,7" (a list) or
/// both ("1-3,9"); each seed once, in the order given.</summary>
public static class SeedList
{
    /// <summary>The most seeds one bench pools (each is a whole bench's decoding).</summary>
    public const int MaxSeeds = 100;

    /// <summary>Reads <paramref name="text"/>; null with <paramref name="problem"/> set when it is
    /// not a list of ranges and seeds, names a seed twice, or names more than <see cref="MaxSeeds"/>.</summary>
    public static IReadOnlyList<int>? Parse(string text, out string? problem)
    {
        ArgumentNullException.ThrowIfNull(text);
        var seeds = new List<int>();
        foreach (string part in text.Split(',', StringSplitOptions.TrimEntries))
        {
            // A range's dash comes after its first digit, so a negative seed ("-3") stays one seed.
            int dash = part.IndexOf('-', 1 < part.Length ? 1 : 0);
            (string first, string last) = dash > 0 ? (part[..dash], part[(dash + 1)..]) : (part, part);
            if (!int.TryParse(first, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out int from)
                || !int.TryParse(last, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out int to))
            {
                problem = $"\"{part}\" is not a seed or a range of seeds (e.g. 1-4 or 1,3,7)";
                return null;
            }

            if (to < from)
            {
                problem = $"the range {part} runs backwards";
                return null;
            }

            if ((long)to - from + 1 + seeds.Count > MaxSeeds)
            {
                problem = $"at most {MaxSeeds} seeds";
                return null;
            }

            for (int s = from; s <= to; s++)
            {
                if (seeds.Contains(s))
                {
                    problem = $"seed {s} is named twice";
                    return null;
                }

                seeds.Add(s);
            }
        }

        problem = null;
        return seeds;
    }

    /// <summary>The seeds as the bench prints them: a run of consecutive seeds as a range.</summary>
    public static string Describe(IReadOnlyList<int> seeds)
    {
        ArgumentNullException.ThrowIfNull(seeds);
        var parts = new List<string>();
        for (int i = 0; i < seeds.Count;)
        {
            int j = i;
            while (j + 1 < seeds.Count && seeds[j + 1] == seeds[j] + 1)
            {
                j++;
            }

            parts.Add(j > i ? FormattableString.Invariant($"{seeds[i]}-{seeds[j]}") : seeds[i].ToString(CultureInfo.InvariantCulture));
            i = j + 1;
        }

        return string.Join(",", parts);
    }
}
