using System.Globalization;
using System.Text;

namespace SizeTest.Inference.Sampling;

/// <summary>
/// Writes the chain as CSV, one row per walker per kept step:
/// <c>step,walker,log_prob,&lt;parameter names…&gt;</c> (numbers in invariant culture, round-trip
/// precision). Given a path, rows go to a temporary file beside the target that is renamed
/// over it only in <see cref="Complete"/>, so an interrupted run never leaves a chain file
/// that looks finished. Given a <see cref="TextWriter"/>, rows go straight to it (the caller
/// owns the writer).
/// </summary>
public sealed class CsvChainStore : IChainStore, IDisposable
{
    private readonly string? _targetPath;
    private readonly string? _tempPath;
    private readonly bool _ownsWriter;
    private readonly int _discard;
    private readonly int _thin;
    private TextWriter? _writer;
    private readonly StringBuilder _line = new();
    private int _walkers;
    private int _dimension;
    private bool _completed;

    /// <summary>Writes to <paramref name="path"/> atomically at <see cref="Complete"/>.</summary>
    /// <param name="path">Target file.</param>
    /// <param name="discard">Steps not written at the start (burn-in).</param>
    /// <param name="thin">Write every <paramref name="thin"/>-th step after the burn-in.</param>
    public CsvChainStore(string path, int discard = 0, int thin = 1)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        CheckView(discard, thin);
        _targetPath = Path.GetFullPath(path);
        var dir = Path.GetDirectoryName(_targetPath)!;
        _tempPath = Path.Combine(dir, $".{Path.GetFileName(_targetPath)}.tmp-{Environment.ProcessId}-{Guid.NewGuid():N}");
        _ownsWriter = true;
        _discard = discard;
        _thin = thin;
    }

    /// <summary>Writes through <paramref name="writer"/>, which the caller keeps owning.</summary>
    /// <param name="writer">Destination.</param>
    /// <param name="discard">Steps not written at the start (burn-in).</param>
    /// <param name="thin">Write every <paramref name="thin"/>-th step after the burn-in.</param>
    public CsvChainStore(TextWriter writer, int discard = 0, int thin = 1)
    {
        ArgumentNullException.ThrowIfNull(writer);
        CheckView(discard, thin);
        _writer = writer;
        _discard = discard;
        _thin = thin;
    }

    /// <inheritdoc/>
    public void Begin(int walkers, int dimension, IReadOnlyList<string> parameterNames, int expectedSteps)
    {
        if (parameterNames.Count != dimension)
            throw new ArgumentException($"Expected {dimension} parameter names, got {parameterNames.Count}.", nameof(parameterNames));
        _walkers = walkers;
        _dimension = dimension;
        if (_ownsWriter)
        {
            Directory.CreateDirectory(Path.GetDirectoryName(_tempPath!)!);
            _writer?.Dispose();
            _writer = new StreamWriter(new FileStream(_tempPath!, FileMode.Create, FileAccess.Write, FileShare.None), new UTF8Encoding(false));
        }
        _writer!.Write("step,walker,log_prob");
        foreach (var name in parameterNames)
        {
            _writer.Write(',');
            _writer.Write(name);
        }
        _writer.Write('\n');
    }

    /// <inheritdoc/>
    public void Append(int step, ReadOnlySpan<double> positions, ReadOnlySpan<double> logProbabilities, ReadOnlySpan<bool> accepted)
    {
        if (_writer is null) throw new InvalidOperationException("Begin must be called before Append.");
        if (step < _discard || (step - _discard) % _thin != 0) return;
        var inv = CultureInfo.InvariantCulture;
        for (int w = 0; w < _walkers; w++)
        {
            _line.Clear();
            _line.Append(step.ToString(inv)).Append(',').Append(w.ToString(inv)).Append(',')
                 .Append(logProbabilities[w].ToString("R", inv));
            for (int p = 0; p < _dimension; p++)
                _line.Append(',').Append(positions[w * _dimension + p].ToString("R", inv));
            _line.Append('\n');
            _writer.Write(_line);
        }
    }

    /// <inheritdoc/>
    public void Complete()
    {
        if (_writer is null) throw new InvalidOperationException("Begin must be called before Complete.");
        _writer.Flush();
        if (_ownsWriter)
        {
            _writer.Dispose();
            _writer = null;
            File.Move(_tempPath!, _targetPath!, overwrite: true);
        }
        _completed = true;
    }

    /// <summary>Closes the file; an uncompleted run's temporary file is deleted.</summary>
    public void Dispose()
    {
        if (!_ownsWriter) return;
        _writer?.Dispose();
        _writer = null;
        if (!_completed && _tempPath is not null)
        {
            try { if (File.Exists(_tempPath)) File.Delete(_tempPath); } catch (IOException) { }
        }
    }

    private static void CheckView(int discard, int thin)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(discard);
        ArgumentOutOfRangeException.ThrowIfLessThan(thin, 1);
    }
}
