namespace SizeTest.Catalogues;

/// <summary>What a catalogue column means to SizeTest.</summary>
public enum ColumnRole
{
    /// <summary><c>id</c>: object identifier (text).</summary>
    Id,
    /// <summary><c>z</c>: redshift (required).</summary>
    Z,
    /// <summary><c>z_err</c>: 1σ redshift error.</summary>
    ZErr,
    /// <summary><c>theta</c>: angular size.</summary>
    Theta,
    /// <summary><c>theta_err</c>: 1σ angular-size error.</summary>
    ThetaErr,
    /// <summary><c>mu</c>: surface brightness, mag/arcsec².</summary>
    Mu,
    /// <summary><c>mu_err</c>: 1σ surface-brightness error.</summary>
    MuErr,
    /// <summary><c>mag</c>: total magnitude.</summary>
    Mag,
    /// <summary><c>mag_err</c>: 1σ magnitude error.</summary>
    MagErr,
    /// <summary><c>band</c>: band or filter name (text).</summary>
    Band,
    /// <summary><c>abs_mag</c>: absolute magnitude computed by the catalogue in a stated reference cosmology (mag).</summary>
    AbsMag,
    /// <summary><c>log_mass</c>: log10 stellar mass in solar masses, computed in a stated reference cosmology (dex).</summary>
    LogMass,
    /// <summary><c>flux_density</c>: radio flux density S_ν at the observing frequency (stored in Jy).</summary>
    FluxDensity,
    /// <summary><c>sersic_n</c>: per-object Sérsic index.</summary>
    SersicN,
    /// <summary><c>group</c>: population label (text), e.g. early/late type.</summary>
    Group,
    /// <summary><c>weight</c>: per-object weight (&gt; 0) multiplying the object's log-likelihood.</summary>
    Weight,
}

/// <summary>The spellings of <see cref="ColumnRole"/> used on the command line, in study files and in output.</summary>
public static class ColumnRoles
{
    /// <summary>All roles in their canonical order.</summary>
    public static IReadOnlyList<ColumnRole> All { get; } = Enum.GetValues<ColumnRole>();

    /// <summary>The role's name: <c>id, z, z_err, theta, theta_err, mu, mu_err, mag, mag_err, band, abs_mag, log_mass,
    /// flux_density, sersic_n, group, weight</c>.</summary>
    public static string Name(this ColumnRole role) => role switch
    {
        ColumnRole.Id => "id",
        ColumnRole.Z => "z",
        ColumnRole.ZErr => "z_err",
        ColumnRole.Theta => "theta",
        ColumnRole.ThetaErr => "theta_err",
        ColumnRole.Mu => "mu",
        ColumnRole.MuErr => "mu_err",
        ColumnRole.Mag => "mag",
        ColumnRole.MagErr => "mag_err",
        ColumnRole.Band => "band",
        ColumnRole.AbsMag => "abs_mag",
        ColumnRole.LogMass => "log_mass",
        ColumnRole.FluxDensity => "flux_density",
        ColumnRole.SersicN => "sersic_n",
        ColumnRole.Group => "group",
        ColumnRole.Weight => "weight",
        _ => throw new ArgumentOutOfRangeException(nameof(role)),
    };

    /// <summary>Parses a role name (case-insensitive; <c>-</c> may stand for <c>_</c>).</summary>
    public static bool TryParse(string text, out ColumnRole role)
    {
        var t = (text ?? "").Trim().ToLowerInvariant().Replace('-', '_');
        foreach (var r in All)
            if (r.Name() == t) { role = r; return true; }
        role = default;
        return false;
    }

    /// <summary>Whether the role holds text rather than numbers.</summary>
    public static bool IsText(this ColumnRole role) => role is ColumnRole.Id or ColumnRole.Band or ColumnRole.Group;

    /// <summary>For an error role, the role whose error it is; otherwise null.</summary>
    public static ColumnRole? ValueRoleOf(this ColumnRole role) => role switch
    {
        ColumnRole.ZErr => ColumnRole.Z,
        ColumnRole.ThetaErr => ColumnRole.Theta,
        ColumnRole.MuErr => ColumnRole.Mu,
        ColumnRole.MagErr => ColumnRole.Mag,
        _ => null,
    };

    /// <summary>For a value role, its error role; otherwise null.</summary>
    public static ColumnRole? ErrorRoleOf(this ColumnRole role) => role switch
    {
        ColumnRole.Z => ColumnRole.ZErr,
        ColumnRole.Theta => ColumnRole.ThetaErr,
        ColumnRole.Mu => ColumnRole.MuErr,
        ColumnRole.Mag => ColumnRole.MagErr,
        _ => null,
    };
}
