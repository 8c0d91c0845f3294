using System.Net.Security;
using System.Security.Cryptography;
using System.Security.Cryptography.X509Certificates;
using LoopWatch.Agent.Configuration;
using MQTTnet;

namespace LoopWatch.Agent.Broker;

/// <summary>
/// TLS to the configured broker from PEM files: the site's CA as the only trust anchor (or the system's store), an optional
/// client certificate and server name. The broker's certificate is always validated; nothing here can switch that off.
/// </summary>
public static class BrokerTls
{
    /// <summary>Problems with the TLS keys, each naming its key; the files are read as a connection reads them.</summary>
    public static List<string> Check(BrokerOptions b)
    {
        var errors = new List<string>();
        if (!b.UseTls)
        {
            // A CA file without UseTls is refused rather than taken to imply TLS: the configuration says what happens on the wire.
            foreach (var (key, value) in new[] { ("CaFile", b.CaFile), ("CertFile", b.CertFile), ("KeyFile", b.KeyFile), ("KeyPassword", b.KeyPassword), ("TlsServerName", b.TlsServerName) })
                if (value is not null) errors.Add($"Broker:{key}: is set while Broker:UseTls is false; set UseTls to true to connect over TLS");
            return errors;
        }
        if (b.Embedded) errors.Add("Broker:UseTls: the embedded broker listens without TLS; UseTls is for an external broker");
        if (b.CaFile is not null) Try(errors, "Broker:CaFile", b.CaFile, () => TrustChain(b.CaFile));
        if (b.CertFile is not null && b.KeyFile is null) errors.Add("Broker:KeyFile: is missing while Broker:CertFile is set");
        else if (b.KeyFile is not null && b.CertFile is null) errors.Add("Broker:CertFile: is missing while Broker:KeyFile is set");
        else if (b.KeyPassword is not null && b.KeyFile is null) errors.Add("Broker:KeyPassword: is set without Broker:KeyFile");
        else if (b.CertFile is not null && File.Exists(b.KeyFile))
            Try(errors, "Broker:CertFile", b.CertFile, () => ClientCertificate(b).Dispose());
        if (b.KeyFile is not null && !File.Exists(b.KeyFile)) errors.Add($"Broker:KeyFile: '{b.KeyFile}' does not exist");
        if (b.TlsServerName is not null && Uri.CheckHostName(b.TlsServerName) == UriHostNameType.Unknown)
            errors.Add($"Broker:TlsServerName: '{b.TlsServerName}' is not a host name");
        return errors;
    }

    /// <summary>
    /// Turns on TLS as configured (nothing without <c>UseTls</c>); <paramref name="refused"/> hears why a broker's certificate
    /// was refused, <paramref name="accepted"/> which certificate was accepted.
    /// </summary>
    public static MqttClientOptionsBuilder WithBrokerTls(this MqttClientOptionsBuilder builder, BrokerOptions b, Action<string>? refused = null, Action<string>? accepted = null)
    {
        if (!b.UseTls) return builder;
        // Read at every connection, so renewed files are taken at the next reconnect without a restart.
        var trust = b.CaFile is null ? null : TrustChain(b.CaFile);
        var client = b.CertFile is null ? null : ClientCertificate(b);
        return builder.WithTlsOptions(o =>
        {
            o.UseTls();
            // MQTTnet makes a trust chain the only root (X509ChainTrustMode.CustomRootTrust); without one the system store applies.
            if (trust is not null) o.WithTrustChain(trust);
            if (client is not null) o.WithClientCertificates([client]);
            if (b.TlsServerName is not null) o.WithTargetHost(b.TlsServerName);
            // The handler only reports: it accepts exactly what the default check accepts (no error at all).
            o.WithCertificateValidationHandler(e =>
            {
                if (e.SslPolicyErrors == SslPolicyErrors.None)
                {
                    accepted?.Invoke(Describe(e.Certificate));
                    return true;
                }
                refused?.Invoke(Reason(e.Certificate, e.Chain, e.SslPolicyErrors));
                return false;
            });
        });
    }

    /// <summary>Why a certificate was refused, in words: its subject and issuer (public), and each failed check.</summary>
    public static string Reason(X509Certificate? certificate, X509Chain? chain, SslPolicyErrors errors)
    {
        if (certificate is null || errors.HasFlag(SslPolicyErrors.RemoteCertificateNotAvailable)) return "the broker sent no certificate";
        var parts = new List<string>();
        if (errors.HasFlag(SslPolicyErrors.RemoteCertificateNameMismatch))
            parts.Add("its names do not include the broker's host name (Broker:TlsServerName gives the name to check)");
        if (errors.HasFlag(SslPolicyErrors.RemoteCertificateChainErrors))
        {
            var status = chain?.ChainStatus.Select(s => $"{s.Status}: {s.StatusInformation.Trim()}").Distinct() ?? [];
            parts.Add($"not trusted ({string.Join("; ", status)}); Broker:CaFile names the CA that issued it");
        }
        return $"{Describe(certificate)}: {string.Join(", ", parts)}";
    }

    private static string Describe(X509Certificate certificate) => certificate is X509Certificate2 c
        ? $"certificate '{c.Subject}' issued by '{c.Issuer}', valid until {c.NotAfter.ToUniversalTime():yyyy-MM-dd HH:mm} UTC"
        : $"certificate '{certificate.Subject}' issued by '{certificate.Issuer}'";

    private static X509Certificate2Collection TrustChain(string file)
    {
        var chain = new X509Certificate2Collection();
        chain.ImportFromPemFile(file);
        return chain.Count > 0 ? chain : throw new CryptographicException("no PEM certificate (BEGIN CERTIFICATE) in it");
    }

    private static X509Certificate2 ClientCertificate(BrokerOptions b)
    {
        var cert = b.KeyPassword is null
            ? X509Certificate2.CreateFromPemFile(b.CertFile!, b.KeyFile)
            : X509Certificate2.CreateFromEncryptedPemFile(b.CertFile!, b.KeyPassword, b.KeyFile);
        if (!OperatingSystem.IsWindows()) return cert;
        // Windows' TLS cannot use the ephemeral key a PEM import gives; a PKCS#12 round trip stores it.
        using (cert) return X509CertificateLoader.LoadPkcs12(cert.Export(X509ContentType.Pkcs12), null);
    }

    private static void Try(List<string> errors, string key, string file, Action read)
    {
        if (!File.Exists(file)) { errors.Add($"{key}: '{file}' does not exist"); return; }
        try { read(); }
        catch (Exception e) when (e is CryptographicException or IOException or UnauthorizedAccessException or ArgumentException)
        {
            errors.Add($"{key}: '{file}' cannot be used: {e.Message}");
        }
    }
}
