using LaunchLogger.Cli.Output;

namespace LaunchLogger.Cli.Tests;

/// <summary>Output files are written as a set: all or none, each through its own temporary file,
/// nothing half-written or left behind on failure or cancellation.</summary>
public class OutputSetTests
{
    [Fact]
    public async Task Simulate_with_out_and_truth_naming_one_file_is_a_usage_error_and_writes_nothing()
    {
        using var folder = new TempFolder();
        string same = folder.File("x.log");
        int code = await LaunchLoggerCommand.InvokeAsync(["simulate", "--out", same, "--truth", same], new StringWriter(), new StringWriter());

        Assert.Equal((int)ExitCode.Usage, code);
        Assert.Empty(Directory.GetFileSystemEntries(folder.Path));
    }

    [Fact]
    public async Task Simulate_with_truth_naming_a_folder_leaves_no_log_behind()
    {
        using var folder = new TempFolder();
        Directory.CreateDirectory(folder.File("truths"));
        var error = new StringWriter();
        int code = await LaunchLoggerCommand.InvokeAsync(["simulate", "--out", folder.File("x.log"), "--truth", folder.File("truths")], new StringWriter(), error);

        Assert.Equal((int)ExitCode.BadInput, code);
        Assert.Contains("is a folder", error.ToString());
        Assert.Equal([folder.File("truths")], Directory.GetFileSystemEntries(folder.Path));
    }

    [Fact]
    public void A_writer_that_fails_midway_leaves_every_target_as_it_was()
    {
        using var folder = new TempFolder();
        string first = folder.Write("a.txt", "old a");
        string second = folder.File("b.txt");

        Assert.Throws<IOException>(() => AtomicFile.WriteAll(
        [
            (first, s => s.Write("new a"u8)),
            (second, s => { s.Write("half"u8); throw new IOException("disk full"); }),
        ]));

        Assert.Equal("old a", File.ReadAllText(first));
        Assert.False(File.Exists(second));
        Assert.Equal([first], Directory.GetFiles(folder.Path));
    }

    [Fact]
    public void Two_targets_naming_one_file_fail_before_anything_is_written()
    {
        using var folder = new TempFolder();
        string same = folder.File("x.json");
        var e = Assert.Throws<IOException>(() => AtomicFile.WriteAll([(same, s => s.WriteByte(1)), (Path.Combine(folder.Path, ".", "x.json"), s => s.WriteByte(2))]));

        Assert.Contains("two outputs", e.Message);
        Assert.Empty(Directory.GetFileSystemEntries(folder.Path));
    }

    [Fact]
    public void Cancelled_before_the_move_changes_nothing()
    {
        using var folder = new TempFolder();
        string target = folder.Write("a.txt", "old");
        using var cancel = new CancellationTokenSource();

        Assert.ThrowsAny<OperationCanceledException>(() => AtomicFile.WriteAll(
            [(target, s => { s.Write("new"u8); cancel.Cancel(); }), (folder.File("b.txt"), s => s.WriteByte(1))],
            cancel.Token));

        Assert.Equal("old", File.ReadAllText(target));
        Assert.Equal([target], Directory.GetFiles(folder.Path));
    }

    [Fact]
    public void A_whole_set_replaces_the_old_files_and_leaves_no_temporaries()
    {
        using var folder = new TempFolder();
        string a = folder.Write("a.txt", "old a");
        string b = folder.File("b.txt");

        AtomicFile.WriteAll([(a, s => s.Write("new a"u8)), (b, s => s.Write("new b"u8))]);

        Assert.Equal("new a", File.ReadAllText(a));
        Assert.Equal("new b", File.ReadAllText(b));
        Assert.Equal(2, Directory.GetFiles(folder.Path).Length);
    }

    [Fact]
    public async Task Demo_into_a_folder_it_cannot_make_leaves_nothing_and_says_so()
    {
        // The output "folder" is an existing file: no folder can be made there.
        using var folder = new TempFolder();
        string notAFolder = folder.Write("plain.txt", "x");
        var error = new StringWriter();

        int code = await LaunchLoggerCommand.InvokeAsync(["demo", "--out", notAFolder], new StringWriter(), error);

        Assert.Equal((int)ExitCode.BadInput, code);
        Assert.Contains("cannot write", error.ToString());
        Assert.Equal([notAFolder], Directory.GetFileSystemEntries(folder.Path));
    }
}
