import net from "node:net";
import type { RunningService } from "./mariadb";
import type { ServiceProfile } from "./profiles";
import { log } from "./util";

function listening(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const s = net.connect({ host: "127.0.0.1", port }, () => {
      s.destroy();
      resolve(true);
    });
    s.on("error", () => resolve(false));
  });
}

/** Runs maildev: an SMTP server that keeps every message, with a web inbox to read them. */
export async function startMailCatcher(p: ServiceProfile): Promise<RunningService> {
  if (await listening(p.smtpPort)) {
    log("mail", `something already listens on 127.0.0.1:${p.smtpPort}; re-using it as SMTP`);
    return { name: "mail", owned: false, stop: async () => {} };
  }
  const { MailDev } = await import("maildev");
  const maildev = new MailDev({
    smtp: p.smtpPort,
    ip: "127.0.0.1",
    web: p.inboxPort,
    webIp: "127.0.0.1",
    silent: true,
  });
  await maildev.start();
  log("mail", `SMTP on 127.0.0.1:${p.smtpPort}, inbox at http://127.0.0.1:${p.inboxPort}`);
  return {
    name: "mail",
    owned: true,
    stop: () => maildev.stop(),
  };
}
