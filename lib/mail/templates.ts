/** Plain-text messages the product sends. Links are absolute, built from NEXTAUTH_URL. */

export function passwordResetMail(link: string) {
  return {
    subject: 'Reset your Lanewise password',
    text: `Someone asked to reset the password of this Lanewise account.\n\nChoose a new password here (the link works once, for one hour):\n${link}\n\nSetting a new password ends every session and revokes your API tokens: you are signed out on every device, scripts need a new token, and any other reset link you were sent stops working.\n\nIf it was not you, ignore this message; your password stays as it is.\n`,
  };
}

export function invitationMail(opts: {
  link: string;
  projectName: string;
  role: string;
  inviter: string;
}) {
  return {
    subject: `You are invited to "${opts.projectName}" on Lanewise`,
    text: `${opts.inviter} invited you to the Lanewise project "${opts.projectName}" as ${opts.role}.\n\nAccept the invitation here (it works once, for seven days):\n${opts.link}\n\nYou will be asked to sign in, or to create an account with this address.\n`,
  };
}

export function runFinishedMail(opts: {
  link: string;
  projectName: string;
  status: string;
  summary: string;
}) {
  return {
    subject: `Link run ${opts.status} in "${opts.projectName}"`,
    text: `Your link run in "${opts.projectName}" has ${opts.status}.\n\n${opts.summary}\n\nOpen it: ${opts.link}\n\nYou can turn these messages off on your Account page.\n`,
  };
}
