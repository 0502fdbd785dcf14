using LaunchLogger.Cli.Bench;

namespace LaunchLogger.Cli.Tests.Bench;

/// <summary>The seeds <c>bench accuracy --seeds</c> pools, as written on the command line.</summary>
public class SeedListTests
{
    [Theory]
    [InlineData("range", "1-4", new[] { 1, 2, 3, 4 })]
    [InlineData("list", "1,3,7", new[] { 1, 3, 7 })]
    [InlineData("both, in the order given", "9,1-3", new[] { 9, 1, 2, 3 })]
    [InlineData("one seed", "5", new[] { 5 })]
    [InlineData("spaces after commas", "1, 2", new[] { 1, 2 })]
    [InlineData("negative seeds", "-2--1", new[] { -2, -1 })]
    public void Seeds_are_read_from_ranges_and_lists(string name, string text, int[] expected)
    {
        IReadOnlyList<int>? seeds = SeedList.Parse(text, out string? problem);

        Assert.True(seeds is not null, $"{name}: {problem}");
        Assert.Equal(expected, seeds);
        Assert.Null(problem);
    }

    [Theory]
    [InlineData("not a number", "a", "not a seed")]
    [InlineData("empty", "", "not a seed")]
    [InlineData("open range", "1-", "not a seed")]
    [InlineData("backwards", "4-1", "backwards")]
    [InlineData("twice", "1-3,2", "seed 2 is named twice")]
    [InlineData("too many", "1-101", "at most 100")]
    public void A_list_that_is_not_one_says_why(string name, string text, string why)
    {
        Assert.Null(SeedList.Parse(text, out string? problem));
        Assert.True(problem is not null && problem.Contains(why, StringComparison.Ordinal), $"{name}: {problem}");
    }

    [Fact]
    public void Consecutive_seeds_print_as_a_range()
    {
        Assert.Equal("1-4,9", SeedList.Describe([1, 2, 3, 4, 9]));
        Assert.Equal("3,1", SeedList.Describe([3, 1]));
    }
}
